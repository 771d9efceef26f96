// Signal processing of recorded runs: noise level, Savitzky–Golay smoothing and velocity with
// a chosen window, logarithmic decrement, and the seeded generator for simulated sensors.
export { savgolCoefficients, savgolFilter, type SavgolOptions } from './savgol.ts';
export { estimateNoise, quantizationStep, type NoiseEstimate } from './noise.ts';
export { chooseSavgol, type SavgolChoice, type ChooseSavgolOverride } from './choose-window.ts';
export {
  logDecrement, decrementFromAmplitudes, dampingRatioFromDecrement,
  type LogDecrementResult, type LogDecrementOptions, type LogDecrementStatus, type Peak,
} from './logdec.ts';
export { analyseRun, type RunAnalysis, type AnalyseRunOptions } from './analyse-run.ts';
export { welchSpectrum, type WelchSpectrum } from './spectrum.ts';
export { fftInPlace } from './fft.ts';
export { Pcg32 } from './random.ts';
