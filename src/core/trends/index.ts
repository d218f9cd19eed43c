/** Trend statistics and attenuation rates from monitoring data (see README.md in this folder). */
export { censorAtHighestLimit, type TimedResult, type CensoredSeries } from './censoring';
export { mannKendall, mannKendallVariance, mannKendallExactUpperTail, tieGroups, type MannKendallResult } from './mannKendall';
export { senSlope, type SenSlope } from './senSlope';
export { analyseTrend, trendVerdict, MIN_ROUNDS_FOR_VERDICT, ROUNDS_ADVISED, type TrendResult, type TrendVerdict } from './trend';
export {
  pointDecayRate,
  bulkAttenuationRate,
  biodegradationRate,
  buscheckAlcantar,
  POINT_RATE_CAUTION,
  type RateEstimate,
  type BulkRate,
  type BiodegradationRate,
  type CentrelinePoint,
} from './rates';
