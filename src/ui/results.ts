/** The results the screen shows; the shapes live with the worker that produces them. */
export type { Evaluation, PlumeLayer, ReceptorRow, ReceptorStatus, WarningItem } from '../worker/protocol';
