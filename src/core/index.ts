/**
 * The engine's public surface. The first block is the fixed contract for external checks; the
 * rest is the richer API the case layer, CLI, workers and UI use. Units: any consistent set for
 * the contract; metres, days and mg/L for the richer API.
 */
export {
  ogataBanks,
  domenico,
  patchSourceExact,
  domenicoGrid,
  patchSourceExactGrid,
} from './contract';
export { captureZoneSingleWell, wellFieldVelocity } from './flow/contract';
export { seepageVelocity, retardationFactor } from './hydro';
export { threePointGradient } from './headPlane';

export {
  darcyFlux,
  kdFromKoc,
  decayRateFromHalfLife,
  effectiveDiffusion,
  bulkDensityFromPorosity,
  longitudinalDispersivity,
  transverseDispersivities,
  type DispersivityRelation,
  type DispersivityEstimate,
} from './hydro';
export { fitHeadPlane, type HeadPoint, type HeadPlaneFit } from './headPlane';
export { ValidationError, type Warning } from './validation';
export { validateModel, domenicoAdmits, domenicoSourceDecayLimit } from './validateModel';
export {
  concentration,
  screenAverage,
  breakthroughCurve,
  firstTimeAtLimit,
  peakConcentration,
  screenReceptorsInto,
  concentrationsAt,
  type ReceptorFiguresInto,
  plumeLength,
  concentrationGrid,
  evaluateReceptor,
  modelWarnings,
  sampleTimes,
  relativeDifference,
  compareSolutions,
  SOLUTIONS_DIFFER_ABOVE,
  type ReceptorFigure,
  type SolutionComparison,
  type Receptor,
  type ReceptorResult,
  STATUS_WORDS,
  statusText,
  type ReceptorStatus,
  type SolutionFigures,
} from './results';
export type { ScreeningModel, SolutionKind, DecayPhase, Point3 } from './model';
export type { ExactOptions } from './solutions/patchSource';
export { erf, erfc, erfcx } from './special/erf';
export * from './units';
export { philox4x32, CounterStream, counterUniform, unitFromWords, checkSeed } from './random';
export * from './uncertainty';
export * from './trends/index';
export { studentTCentral, studentTQuantile } from './stats/distributions';
export { fitLine, type LineFit } from './stats/regression';
export {
  prepareFlow,
  velocity as flowVelocity,
  velocityGradient,
  potential as dischargePotential,
  drawdown,
  flowWarnings,
  insideAquifer,
  DEFAULT_WELL_RADIUS,
  type FlowInput,
  type FlowWell,
  type FlowBoundary,
  type BoundaryKind,
  type FlowField,
} from './flow/field';
export { confinedHead, confinedHeadLattice, unconfinedHead, dewatered, type HeadReference } from './flow/heads';
export {
  traceStreamline,
  stagnationPoints,
  dividingStreamlines,
  captureZone,
  sourceCapture,
  positionAt,
  sweptOutline,
  isochroneFront,
  type Streamline,
  type CaptureZone,
  type Isochrone,
  type SourceCapture,
  type StagnationPoint,
} from './flow/trace';
export {
  prepareWalk,
  emptyTally,
  mergeTally,
  walkParticles,
  observerConcentrations,
  wellConcentrations,
  gridConcentration,
  gridFrames,
  scaledTally,
  type WalkInput,
  type WalkTally,
  type PreparedWalk,
  type WalkObserver,
  type WalkGrid,
  type WalkSource,
  type ParticleEstimate,
} from './particles/walk';
export { levenbergMarquardt, solveLinear, type LeastSquaresFit, type LeastSquaresProblem } from './fit/levenbergMarquardt';
