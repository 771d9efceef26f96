// The column mapping for CSV recordings, shared by the Recordings form and drag and drop.
export const mapping = $state({ time: 'time', position: 'position', run: '', input: '', angle: false });

export function cleanMapping() {
  return {
    time: mapping.time,
    position: mapping.position,
    ...(mapping.run ? { run: mapping.run } : {}),
    ...(mapping.input ? { input: mapping.input } : {}),
    angle: mapping.angle,
  };
}
