// ODE integrators: the public face of engine/ode.
export { rk4Step, rk4Work, rk4Fixed, type Rk4Work, type FixedStepResult } from './rk4.ts';
export { solveDopri5, type Dopri5Options, type OdeResult, type OdeStatus } from './dopri5.ts';
export { type OdeEvent, type EventHit } from './events.ts';
export { solveVerlet, type Accel, type VerletOptions, type VerletResult } from './verlet.ts';
export { rk4HeldStep, type HeldAccel } from './rk4-held.ts';
