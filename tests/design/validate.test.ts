import { describe, expect, it } from 'vitest';
import { DesignError, readDesign } from '../../src-main/design/validate.ts';
import { pendulumDesign } from './fixtures.ts';

const good = () => JSON.parse(JSON.stringify(pendulumDesign())) as Record<string, any>;

/** A bad variant of the good document and the field path its error must name. */
const cases: [string, (d: Record<string, any>) => void, RegExp][] = [
  ['not an object', (d) => { for (const k of Object.keys(d)) delete d[k]; d.format = 1; }, /format: expected "ergostat-controller-design"/],
  ['wrong format', (d) => { d.format = 'ergostat-energy-model'; }, /x\.json: format: expected/],
  ['wrong version', (d) => { d.version = 2; }, /version: expected 1/],
  ['unknown kind', (d) => { d.kind = 'bang-bang'; }, /kind: expected "level-hold" or "well-hop"/],
  ['unknown top-level field', (d) => { d.gains = 3; }, /gains: unknown field/],
  ['missing field', (d) => { delete d.law; }, /law: missing/],
  ['bad coordinate', (d) => { d.model.coordinate = 'polar'; }, /model\.coordinate: expected "angle" or "linear"/],
  ['energy syntax error', (d) => { d.model.energy = 'v^2 + (q'; }, /model\.energy: column/],
  ['energy with a foreign name', (d) => { d.model.energy = 'v^2 + k*q^2'; }, /model\.energy: .*k/],
  ['energy mentioning u', (d) => { d.model.energy = 'v^2 + u'; }, /model\.energy:/],
  ['acceleration not a formula', (d) => { d.model.acceleration = 42; }, /model\.acceleration: expected a string/],
  ['acceleration with a bad name', (d) => { d.model.acceleration = '-sin(q) + w'; }, /model\.acceleration:/],
  ['units', (d) => { d.model.units = 'kJ'; }, /model\.units: expected "J" or "J\/kg"/],
  ['lambda not finite', (d) => { d.model.lambda = 'NaN'; }, /model\.lambda: expected a finite number/],
  ['empty q range', (d) => { d.model.validRange.qMax = -4; }, /model\.validRange\.qMax: must exceed qMin/],
  ['energy range reversed', (d) => { d.model.validRange.energyMax = -1; }, /model\.validRange\.energyMax/],
  ['well numbering', (d) => { d.model.wells[0].index = 2; }, /model\.wells\[0\]\.index: expected 1/],
  ['barrier naming a missing well', (d) => { d.model.barriers[0].between = [1, 3]; }, /model\.barriers\[0\]\.between\[1\]/],
  ['input gain zero', (d) => { d.input.gain = 0; }, /input\.gain: expected a non-zero/],
  ['input unit', (d) => { d.input.unit = 5; }, /input\.unit: expected a string/],
  ['Q zero', (d) => { d.law.Q = 0; }, /law\.Q: expected a positive number/],
  ['R negative', (d) => { d.law.R = -1; }, /law\.R: expected a positive number/],
  ['eps negative', (d) => { d.law.eps = -0.1; }, /law\.eps: expected a number >= 0/],
  ['law lambda', (d) => { d.law.lambda = null; }, /law\.lambda: expected a finite number/],
  ['uMax zero', (d) => { d.law.uMax = 0; }, /law\.uMax: expected a positive number/],
  ['rateMax string', (d) => { d.law.rateMax = '50'; }, /law\.rateMax: expected a finite number/],
  ['integral weight', (d) => { d.law.integral = { Qw: -1, antiWindup: 'none' }; }, /law\.integral\.Qw/],
  ['anti-windup', (d) => { d.law.integral = { Qw: 1, antiWindup: 'back-calculation' }; }, /law\.integral\.antiWindup/],
  ['loss compensation', (d) => { d.law.lossCompensation = 'yes'; }, /law\.lossCompensation: expected true or false/],
  ['sample rate', (d) => { d.sampleRateHz = 0; }, /sampleRateHz: expected a positive number/],
  ['delay', (d) => { d.delaySamples = 1.5; }, /delaySamples: expected an integer/],
  ['no stages', (d) => { d.stages = []; }, /stages: expected at least one stage/],
  ['stage numbering', (d) => { d.stages[0].index = 0; }, /stages\[0\]\.index/],
  ['stage name', (d) => { d.stages[0].name = null; }, /stages\[0\]\.name: expected a string/],
  ['target kind', (d) => { d.stages[0].target = { kind: 'height', energy: 1 }; }, /stages\[0\]\.target\.kind/],
  ['target energy', (d) => { d.stages[0].target = { kind: 'energy', energy: 'high' }; }, /stages\[0\]\.target\.energy: expected a finite number/],
  ['amplitude target without amplitude', (d) => { d.stages[0].target = { kind: 'amplitude', energy: 1 }; }, /stages\[0\]\.target\.amplitude: missing/],
  ['at-rest target naming a missing well', (d) => { d.stages[0].target = { kind: 'at-rest', well: 4, energy: 0 }; }, /stages\[0\]\.target\.well/],
  ['meanB2', (d) => { d.stages[0].meanB2 = 0; }, /stages\[0\]\.meanB2: expected a positive number/],
  ['level hold with two stages', (d) => { d.stages.push({ ...d.stages[0], index: 2 }); }, /kind: a level-hold design has one stage/],
  ['initial stage', (d) => { d.initialStage = 2; }, /initialStage: expected an integer from 1 to 1/],
  ['transition to a missing stage', (d) => { d.kind = 'well-hop'; d.transitions = [{ from: 1, to: 2, when: { qAbove: 0 }, reason: '' }]; }, /transitions\[0\]\.to: expected an integer from 1 to 1/],
  ['transition with no clause', (d) => { d.kind = 'well-hop'; d.stages.push({ ...d.stages[0], index: 2 }); d.transitions = [{ from: 1, to: 2, when: { wrapped: true }, reason: '' }]; }, /transitions\[0\]\.when: expected at least one clause/],
  ['transition with vSign 0', (d) => { d.kind = 'well-hop'; d.stages.push({ ...d.stages[0], index: 2 }); d.transitions = [{ from: 1, to: 2, when: { vSign: 0 }, reason: '' }]; }, /transitions\[0\]\.when\.vSign: expected 1 or -1/],
  ['transition with an unknown clause', (d) => { d.kind = 'well-hop'; d.stages.push({ ...d.stages[0], index: 2 }); d.transitions = [{ from: 1, to: 2, when: { qAround: 0 }, reason: '' }]; }, /transitions\[0\]\.when\.qAround: unknown field/],
  ['self transition', (d) => { d.kind = 'well-hop'; d.stages.push({ ...d.stages[0], index: 2 }); d.transitions = [{ from: 2, to: 2, when: { qAbove: 0 }, reason: '' }]; }, /transitions\[0\]\.to: a transition must change the stage/],
  ['wrapped on a linear rig', (d) => { d.kind = 'well-hop'; d.model.coordinate = 'linear'; d.stages.push({ ...d.stages[0], index: 2 }); d.transitions = [{ from: 1, to: 2, when: { qAbove: 0, wrapped: true }, reason: '' }]; }, /transitions\[0\]\.when\.wrapped: only an angle/],
  ['no cautions', (d) => { d.cautions = []; }, /cautions: expected the safety cautions/],
  ['caution not text', (d) => { d.cautions = [3]; }, /cautions\[0\]: expected a string/],
  ['check without ok', (d) => { d.checks = [{ name: 'x', detail: '' }]; }, /checks\[0\]\.ok: missing/],
  ['too many stages', (d) => { d.stages = Array.from({ length: 65 }, (_, i) => ({ ...d.stages[0], index: i + 1 })); }, /stages: at most 64 entries/],
];

describe('readDesign', () => {
  it('accepts a good document and returns an equal copy that shares nothing with the input', () => {
    const src = good();
    const d = readDesign(src, 'x.json');
    expect(d).toEqual(src);
    d.stages[0].name = 'changed';
    expect(src.stages[0].name).toBe('hold');
  });

  it('reads a staged design with its transitions', () => {
    const src = good();
    src.kind = 'well-hop';
    src.stages.push({ index: 2, name: 'settle', target: { kind: 'at-rest', well: 1, energy: 0 }, meanB2: null });
    src.transitions = [{ from: 1, to: 2, when: { qAbove: 0.5, vSign: -1, wrapped: true }, reason: 'past the top' }];
    const d = readDesign(src, 'x.json');
    expect(d.transitions[0].when).toEqual({ qAbove: 0.5, vSign: -1, wrapped: true });
    expect(d.stages[1].target).toEqual({ kind: 'at-rest', well: 1, energy: 0 });
  });

  for (const [name, spoil, message] of cases) {
    it(`rejects a bad field, naming it: ${name}`, () => {
      const d = good();
      spoil(d);
      let err: unknown;
      try { readDesign(d, 'x.json'); } catch (e) { err = e; }
      expect(err).toBeInstanceOf(DesignError);
      expect((err as Error).message).toMatch(/^x\.json: /);
      expect((err as Error).message).toMatch(message);
    });
  }

  it('rejects a non-object document', () => {
    expect(() => readDesign(null, 'd.json')).toThrow(/^d\.json: expected an object, got null/);
    expect(() => readDesign([1], 'd.json')).toThrow(/^d\.json: expected an object/);
  });
});
