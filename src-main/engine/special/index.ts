// Special functions: the public face of engine/special.
export { ellipK, ellipKm1, pendulumPeriod } from './ellipk.ts';
