// Position sensor model: wrap to [-pi, pi) for angles (like an absolute encoder), additive
// Gaussian noise, then mid-tread quantization x_q = step * round(x / step) (Widrow & Kollar,
// "Quantization Noise", 2008, ch. 4: uniform quantizer, error variance step^2 / 12).
import type { Coordinate } from '../types.ts';
import type { SensorOptions } from './types.ts';
import { gaussianSource, type UniformSource } from './gaussian.ts';

const TWO_PI = 2 * Math.PI;

/** Wraps an angle to [-pi, pi). */
export function wrapAngle(x: number): number {
  return x - TWO_PI * Math.floor((x + Math.PI) / TWO_PI);
}

/** Quantization step of a sensor (0 when it does not quantize). Throws on bad settings, naming the field. */
export function sensorStep(sensor: SensorOptions, coordinate: Coordinate): number {
  if (sensor.step !== undefined && sensor.bits !== undefined) throw new RangeError('sensor: give either step or bits, not both');
  if (sensor.step !== undefined) {
    if (!(sensor.step >= 0) || !Number.isFinite(sensor.step)) throw new RangeError(`sensor.step must be a finite number >= 0, got ${sensor.step}`);
    return sensor.step;
  }
  if (sensor.bits === undefined) return 0;
  if (!Number.isInteger(sensor.bits) || sensor.bits < 1 || sensor.bits > 52) throw new RangeError(`sensor.bits must be an integer in 1..52, got ${sensor.bits}`);
  const range = sensor.range ?? (coordinate === 'angle' ? TWO_PI : undefined);
  if (range === undefined) throw new RangeError('sensor.range is required with sensor.bits for a linear coordinate (the span the bits cover)');
  if (!(range > 0) || !Number.isFinite(range)) throw new RangeError(`sensor.range must be a positive finite number, got ${range}`);
  return range / 2 ** sensor.bits;
}

export interface Sensor {
  /** Quantization step (0 = none). */
  step: number;
  noiseStd: number;
  /** The reading for the true position q (wrapped to [-pi, pi) for angles). */
  measure(q: number): number;
}

/** Builds a sensor; `uniform` is the random source for the noise (needed only when noiseStd > 0). */
export function makeSensor(sensor: SensorOptions, coordinate: Coordinate, uniform?: UniformSource): Sensor {
  const step = sensorStep(sensor, coordinate);
  const noiseStd = sensor.noiseStd ?? 0;
  if (!(noiseStd >= 0) || !Number.isFinite(noiseStd)) throw new RangeError(`sensor.noiseStd must be a finite number >= 0, got ${sensor.noiseStd}`);
  if (noiseStd > 0 && !uniform) throw new RangeError('sensor.noiseStd > 0 needs a random source (options.random)');
  const normal = noiseStd > 0 && uniform ? gaussianSource(uniform) : () => 0;
  const angle = coordinate === 'angle';
  return {
    step,
    noiseStd,
    measure(q: number): number {
      let x = angle ? wrapAngle(q) : q;
      if (noiseStd > 0) x += noiseStd * normal();
      if (step > 0) x = step * Math.round(x / step);
      return angle ? wrapAngle(x) : x;
    },
  };
}
