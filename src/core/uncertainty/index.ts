/** Uncertainty: distributions, Latin hypercube sampling over counter-based streams, statistics. */
export { normalCdf, normalQuantile } from './normal';
export { makeSampler, rangeText, type Distribution, type DistributionKind, type PhysicalRange, type Sampler, type Truncation } from './distributions';
export { LatinHypercube, stratumPermutation, checkRuns, MAX_RUNS, PURPOSE_LHS_PERMUTATION, PURPOSE_LHS_POSITION } from './lhs';
export { exceedance, percentiles, ranks, pearson, spearman, thirdsExceedance, type Exceedance } from './statistics';
export { planeSlopeCovariance, samplePlaneSlope, type PlaneSlopeCovariance } from './planeFit';
