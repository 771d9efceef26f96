// The stage a controller design ends in: its target is what a trial is scored against.
import type { ControllerDesign } from './types.ts';

/** The stage the design ends in: the last stage no transition leaves (the last stage if every one is left). */
export function finalStage(d: ControllerDesign) {
  for (let i = d.stages.length - 1; i >= 0; i--) if (!d.transitions.some((t) => t.from === d.stages[i].index)) return d.stages[i];
  return d.stages[d.stages.length - 1];
}

