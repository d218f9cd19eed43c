/**
 * The shape of the results the screen shows (and the report reads from `currentResults`).
 * Everything is in internal units (m, d, mg/L); the components convert for display.
 * Produced in the worker (src/worker/screening.ts) from src/case/screen.ts and src/core, read by
 * the screen and the report through `currentResults` (src/ui/state.ts).
 */
import type { PackedBands } from '../geo/contours';
import type { ExportReceptorResult } from '../case/export-results';
import type { ReceptorResult } from '../core';
import type { MapCaptureZone, ReceptorHead, WellCapture } from '../case/wells';
import type { HeadContours } from '../case/headContours';

/**
 * The steady well field of the case (pumping receptors with rates, boundary lines): per pumping
 * well its capture of the source, and its capture zone with time-of-travel marks as map positions.
 * null when the case has nothing to model (no pumping well with a rate and no boundary line, or no
 * saturated thickness: then a warning says so).
 */
export interface WellsLayer {
  /** saturated thickness B, m */
  thickness: number;
  captures: WellCapture[];
  zones: MapCaptureZone[];
  /** why the zones could not be traced (the captures may still be there), or null */
  zoneError: string | null;
  /** water levels at each receptor, confined and unconfined (Dupuit) forms, referred to the release */
  heads: ReceptorHead[];
  /** where the unconfined thickness departs from the constant one, in words */
  headWarnings: string[];
  /** lines of equal head around the wells for the map (src/case/headContours.ts), or null */
  headContours: HeadContours | null;
  /** worker milliseconds spent on them (lattice, contouring, mapping) */
  headContoursMs: number;
}

export type ReceptorStatus = 'reaches-limit' | 'below-limit' | 'not-reached-in-horizon';

export interface WarningItem {
  code: string;
  message: string;
  field?: string;
}

/** A receptor's figures: the export layer's row (src/case/export-results.ts) with the other solution. */
export interface ReceptorRow extends ExportReceptorResult {
  status: ReceptorStatus;
  /** the other solution, when it applies, compared with the chosen one under the one rule
   * (core SOLUTIONS_DIFFER_ABOVE); everything that shows results shows it where `showBoth` */
  alternate: ReceptorResult['alternate'];
  warnings: WarningItem[];
  /** breakthrough curve (screen average) at `curveTimes` for the chosen and the other solution */
  curve: number[];
  curveAlternate: number[] | null;
}

export interface PlumeLayer {
  /** `modified` of the case the contours belong to */
  caseStamp: string;
  solution: 'domenico' | 'exact';
  /** view time of the contours, d (Infinity: steady state) */
  time: number;
  /** depth of the map slice below the water table, m */
  depth: number;
  /** the limit, mg/L (properties.multiple of the GeoJSON bands = threshold / limit) */
  limit: number;
  thresholds: number[];
  /**
   * the bands C ≥ threshold, one per threshold (possibly empty), in map coordinates as typed
   * arrays (transferred from the worker, not cloned); `plumeGeoJSON` (src/ui/results.ts) gives
   * the RFC 7946 FeatureCollection, one MultiPolygon feature per non-empty band
   */
  bands: PackedBands;
  /** flow-frame extent of the lattice, m */
  extent: { x0: number; x1: number; y0: number; y1: number };
  gridSize: number;
  /**
   * worker-side milliseconds: case preparation and lattice, lattice values (the engine's pure
   * compute), contouring and packing, everything; and when the job started and finished
   * (milliseconds since the epoch, performance.timeOrigin + performance.now(), comparable with
   * the page's clock)
   */
  timing: { prepareMs: number; gridMs: number; contourMs: number; totalMs: number; startedAt: number; finishedAt: number };
}

export interface Evaluation {
  caseId: string;
  /** `modified` of the case these results belong to */
  caseStamp: string;
  solution: 'domenico' | 'exact';
  limit: number;
  horizon: number;
  viewTime: number;
  derived: {
    v: number;
    R: number;
    kd: number;
    ax: number;
    ay: number;
    az: number;
    decay: number;
    gradient: number;
    azimuthDeg: number;
    width: number;
    /** relation and citation when the dispersivity was estimated; null when given */
    dispersivityRelation: string | null;
    /** distance the dispersivity was scaled from, m */
    dispersivityScale: number | null;
    widthFromFootprint: boolean;
    headFit: { residuals: number[]; readingIds: string[] } | null;
  };
  curveTimes: number[];
  receptors: ReceptorRow[];
  /** centreline distance to the limit at the map depth at the view time, m (null: the source itself is below it) */
  plumeLength: number | null;
  /** the same at steady state */
  plumeLengthSteady: number | null;
  profile: { xs: number[]; values: number[]; alternate: number[] | null; time: number };
  plume: PlumeLayer | null;
  wells: WellsLayer | null;
  warnings: WarningItem[];
  caution: string;
  timing: { screenMs: number; curvesMs: number };
}
