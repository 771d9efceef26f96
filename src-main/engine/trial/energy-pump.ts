// The classic energy-pumping law u = -k sign(b) (H - H*), b = (dH/dv) g, saturated at |u| <= uMax
// (Åström & Furuta, "Swinging up a pendulum by energy control", Automatica 36 (2000) 287–295;
// with a Lyapunov function (H - H*)^2 / 2 this makes dH/dt = -k |b| (H - H*) for an undamped plant).
// With eps > 0, sign(b) is regularised as b / sqrt(b^2 + eps^2) (design.md §2) so it does not chatter.
// Optional integral action (integral > 0): u = -k sign(b) (z + k_i w), w' = z, so that in steady
// state the time average of z vanishes: the cycle-averaged H (not the |b|-weighted one the plain
// law balances) is brought to H* even when the model's H swings within a period under mismatch.
// Anti-windup (Astrom & Hagglund, "PID Controllers", 2nd ed., §3.5): conditional integration, only
// while |z| <= integralLimit, and clamping of the target shift, |k_i w| <= integralLimit (default
// 0.2 |H*|, or uMax / k when H* = 0).
// Used as a baseline beside the level-hold law (plain form), and as the controller of the trial tests.
import type { EnergyFunction } from '../types.ts';
import type { Controller } from './types.ts';

export interface EnergyPumpOptions {
  energy: EnergyFunction;
  /** Target energy H*. */
  target: number;
  /** Gain k (units of u per unit of H); the SDRE law with lambda = 0 has k = sqrt(Q / R). */
  gain: number;
  /** Saturation |u| <= uMax. Default Infinity. */
  uMax?: number;
  /** Input gain g of B = (0, g): q'' = ... + g u. Default 1. */
  inputGain?: number;
  /** Regularisation of sign(b) near b = 0 (unit of b). Default 0 (plain sign). */
  eps?: number;
  /** Integral gain k_i (1/s) of the optional integral action; 0 = the plain law. Default 0. */
  integral?: number;
  /** Largest target shift |k_i w| the integral may make (unit of H). Default 0.2 |H*| (uMax / k when H* = 0). */
  integralLimit?: number;
}

export function energyPump(options: EnergyPumpOptions): Controller {
  const { energy } = options;
  if (!energy || typeof energy.grad !== 'function') throw new TypeError('energyPump: energy must be an EnergyFunction with grad(q, v, out)');
  const fin = (name: string, x: number | undefined, def: number, ok: (x: number) => boolean, what: string) => {
    const y = x ?? def;
    if (typeof y !== 'number' || Number.isNaN(y) || !ok(y)) throw new RangeError(`energyPump: ${name} must be ${what}, got ${String(x)}`);
    return y;
  };
  const target = fin('target', options.target, NaN, Number.isFinite, 'a finite number');
  const k = fin('gain', options.gain, NaN, (x) => x >= 0 && Number.isFinite(x), 'a finite number >= 0');
  const uMax = fin('uMax', options.uMax, Infinity, (x) => x > 0, 'a number > 0');
  const g = fin('inputGain', options.inputGain, 1, (x) => x !== 0 && Number.isFinite(x), 'a finite non-zero number');
  const eps = fin('eps', options.eps, 0, (x) => x >= 0 && Number.isFinite(x), 'a finite number >= 0');
  const ki = fin('integral', options.integral, 0, (x) => x >= 0 && Number.isFinite(x), 'a finite number >= 0');
  const shift = fin('integralLimit', options.integralLimit, target !== 0 ? 0.2 * Math.abs(target) : uMax / k, (x) => x >= 0, 'a number >= 0');
  const wMax = ki > 0 ? shift / ki : 0;
  const grad = new Float64Array(2);
  let w = 0;
  return {
    reset() { w = 0; },
    step(q, v, _t, dt) {
      energy.grad(q, v, grad);
      const b = grad[1] * g;
      const s = eps > 0 ? b / Math.sqrt(b * b + eps * eps) : Math.sign(b);
      const z = energy.H(q, v) - target;
      const u = -k * s * (z + ki * w);
      if (ki > 0 && Math.abs(z) <= shift) {
        w += z * dt;
        if (w > wMax) w = wMax; else if (w < -wMax) w = -wMax;
      }
      return u > uMax ? uMax : u < -uMax ? -uMax : u;
    },
  };
}

/** Open loop: u = 0 at every sample. */
export function openLoop(): Controller {
  return { reset() {}, step() { return 0; } };
}
