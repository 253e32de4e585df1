// Design exploration: bonding options, sensitivity sweeps, tornado and joint-bay placement.
// Pure like the rest of the core: the runner (src/lib/explore) schedules the work.
export { ExploreError } from './errors';
export { evaluateStudy, reduceChecklist, type CheckedQuantity, type StudyFigures } from './evaluate';
export { appraiseBondingOptions, bondingOptions, countLinkBoxes, OPTION_LABELS, type Appraisal, type OptionRow, type BondingOptionKey } from './options';
export { SWEEP_LIMITS, applyInput, axisValues, baseValue, checkSweep, firstFailures, gridValues, inputLabel, studyAt, sweepPoint, type FirstFailure, type SweepAxis, type SweepInput, type SweepPoint } from './sweep';
export { tornado, TORNADO_MAX_INPUTS, type Tornado, type TornadoBar, type TornadoInput } from './tornado';
export { suggestPlacement, type MajorSectionPlacement, type Placement, type PlacementRequest } from './placement';
