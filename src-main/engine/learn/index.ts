// Energy map: learning the conserved energy H(q, v) from recordings (design.md §2).
export { learnEnergy, LEARN_LIMITS, type LearnOptions } from './learnEnergy.ts';
export { toEnergyFunction } from './energyFunction.ts';
export { gradientFormulas } from './gradientFormulas.ts';
export { modelEvaluator, termFromSpec, specFromTerm } from './model.ts';
export type { EnergyModel, TermSpec, Landscape, Well, Barrier, Verdict, VerdictCode, CandidateReport, ParetoPoint, ReplayReport } from './model.ts';
export { buildLibrary, termLabel, formulaOf, type Term, type LibraryOptions } from './library.ts';
export { accumulateGrams, addGramSet, emptyGramSet, sumGramSets, type GramSet } from './gram.ts';
export { generalizedEigen } from './geneig.ts';
export { solveWeak, weakMatrices, nonConservation } from './weakForm.ts';
export { findLandscape } from './landscape.ts';
export { unwrapAngles } from './prepare.ts';
