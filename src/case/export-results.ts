/**
 * What the file exports read from a screening: the structural subset of the app's results
 * (src/ui/results.ts `Evaluation`) that GeoJSON and CSV need. Internal units: m, d, mg/L.
 * Kept structural so these pure exports depend on no UI code.
 */
import type { FeatureCollection, MultiPolygon } from 'geojson';
import type { ReceptorResult } from '../core';
import type { MapCaptureZone, WellCapture } from './wells';
import type { HeadContours } from './headContours';
import type { ParticleFigures } from './particles';

/** The steady well field: per pumping well its capture figures and its zone with travel-time marks (map positions). */
export interface ExportWells {
  captures: readonly WellCapture[];
  zones: readonly MapCaptureZone[];
  /** the lines of equal water level drawn on the map, when computed */
  headContours?: HeadContours | null;
}

/** A particle run of the case: its count and seed, and per receptor (by id) its figures. */
export interface ExportParticles {
  particles: number;
  seed: number;
  receptors: readonly (ParticleFigures & { id: string })[];
}

export interface ExportReceptorResult {
  id: string;
  name: string;
  kind: string;
  x: number;
  y: number;
  zTop: number;
  zBottom: number;
  distance: number;
  /** first time the screen-average concentration reaches the limit, d (null: not within the horizon) */
  arrival: number | null;
  atHorizon: number;
  peak: { c: number; t: number };
  steady: number;
  status: string;
  /** the other solution's figures and how they compare (core compareSolutions); absent or null where it does not apply */
  alternate?: ReceptorResult['alternate'];
  /** breakthrough curve at `curveTimes`, mg/L */
  curve?: ArrayLike<number>;
  curveAlternate?: ArrayLike<number> | null;
}

export interface ExportResults {
  solution: 'domenico' | 'exact';
  limit: number;
  horizon: number;
  curveTimes?: ArrayLike<number>;
  receptors: ExportReceptorResult[];
  plumeLength: number | null;
  plume: { time: number; geojson: FeatureCollection<MultiPolygon> } | null;
  caution: string;
  /** the well field, when the case models one */
  wells?: ExportWells | null;
  /** a complete particle run of this very case */
  particles?: ExportParticles | null;
}

/** The other solution's name (for column headers and labels). */
export function otherSolution(s: 'domenico' | 'exact'): 'domenico' | 'exact' {
  return s === 'domenico' ? 'exact' : 'domenico';
}

export const SOLUTION_LABEL: Record<'domenico' | 'exact', string> = {
  domenico: 'Domenico 1987 approximation',
  exact: 'exact rectangular-source solution',
};

/** The method of the analytical figures, as every export names it: the solution, in uniform regional flow (no pumping). */
export function analyticalMethod(s: 'domenico' | 'exact'): string {
  return `analytical: ${SOLUTION_LABEL[s]}, uniform regional flow (pumping not represented)`;
}
