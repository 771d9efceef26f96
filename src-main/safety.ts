// The safety cautions (team design notes §5), in one place: the app shows them where a
// controller is armed or exported, the report prints them, exported C carries them in its header.

export const SAFETY_CAUTIONS: readonly string[] = Object.freeze([
  "Respect the actuator's force, travel and speed limits and the rig's end stops; set the controller's limits below them.",
  'Start with low gains and a low energy target, and raise them step by step.',
  'Guard the swept volume of the moving parts; nobody inside it while the loop is closed.',
  'Keep a hardware emergency stop within reach whenever the controller runs.',
  'Try the controller in simulation first, then on the rig at reduced energy, before full trials.',
  'The simulation is only as good as the recordings the energy was learned from: a model learned from small swings says little about large ones.',
]);

export const SAFETY_DEFERENCE =
  "Ergostat does not replace your lab's safety rules, the machinery-safety standards that apply to your rig, local codes, " +
  'or the judgement of a licensed engineer; where they differ from this tool, they win.';
