// Event functions g(t, y) = 0 located during integration, in the manner of SciPy's solve_ivp
// (direction and terminal flags): a sign change of g over an accepted step is bracketed and its
// root found by Brent's method (./brent.ts) on the step's dense-output interpolant
// (Hairer, Nørsett & Wanner, "Solving ODEs I", §II.6, "event location" via dense output).
import { argError, checkFunction } from './check-args.ts';

export interface OdeEvent {
  /** Event function; a root g(t, y) = 0 is an event. Must not keep y (a reused buffer). */
  g: (t: number, y: Float64Array) => number;
  /** +1: only crossings where g goes from negative to non-negative; -1: positive to non-positive; 0 (default): both. */
  direction?: -1 | 0 | 1;
  /** true: stop at the first occurrence; a positive integer k: stop at the k-th; false/undefined: record only. */
  terminal?: boolean | number;
}

/** One located event: which function (its index in `events`), when, and the interpolated state there. */
export interface EventHit {
  index: number;
  t: number;
  y: Float64Array;
}

/** Validated event list: direction and terminal count per event (0 = not terminal). */
export interface EventSpec {
  g: ((t: number, y: Float64Array) => number)[];
  direction: Int8Array;
  stopAfter: Int32Array;
}

export function checkEvents(fn: string, events: unknown): EventSpec {
  if (events === undefined) return { g: [], direction: new Int8Array(0), stopAfter: new Int32Array(0) };
  if (!Array.isArray(events)) throw argError(fn, 'options.events', 'an array of {g, direction?, terminal?}', events);
  const m = events.length;
  const spec: EventSpec = { g: [], direction: new Int8Array(m), stopAfter: new Int32Array(m) };
  for (let k = 0; k < m; k++) {
    const ev = events[k] as Partial<OdeEvent> | null;
    const name = `options.events[${k}]`;
    if (ev === null || typeof ev !== 'object') throw argError(fn, name, 'an object {g, direction?, terminal?}', ev);
    checkFunction(fn, `${name}.g`, ev.g);
    spec.g.push(ev.g as OdeEvent['g']);
    const dir = ev.direction ?? 0;
    if (dir !== -1 && dir !== 0 && dir !== 1) throw argError(fn, `${name}.direction`, '-1, 0 or +1', dir);
    spec.direction[k] = dir;
    const term = ev.terminal ?? false;
    if (term === true) spec.stopAfter[k] = 1;
    else if (term === false) spec.stopAfter[k] = 0;
    else if (typeof term === 'number' && Number.isInteger(term) && term >= 1 && term < 2 ** 31) spec.stopAfter[k] = term;
    else throw argError(fn, `${name}.terminal`, 'a boolean or a positive integer', term);
  }
  return spec;
}

/**
 * Does g going from gOld to gNew over one step count as a crossing in `direction`?
 * A root exactly at the step start (gOld = 0) was already counted at the end of the previous step
 * (or is the initial point, which is never an event).
 */
export function crosses(gOld: number, gNew: number, direction: number): boolean {
  const up = gOld < 0 && gNew >= 0;
  const down = gOld > 0 && gNew <= 0;
  return direction > 0 ? up : direction < 0 ? down : up || down;
}
