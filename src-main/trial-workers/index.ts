// Public face of the trial workers: Monte Carlo over parameter mismatch on worker threads.
export { runMonteCarlo, type MonteCarloSpec, type MonteCarloOptions, type MonteCarloResult, type MonteCarloRun, type MonteCarloProgress } from './monte-carlo.ts';
export { runMonteCarloTrial } from './run-one.ts';
