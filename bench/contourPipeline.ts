/**
 * The contour pipeline's cost (issue 3): a flow-aligned n × n grid by concentrationGrid, then the
 * filled bands by contourBands (src/geo/contours.ts). Prints compute-only and compute + contour
 * times and their ratio; the browser measurement of the whole input-change-to-redraw latency builds
 * on this (same grid, same thresholds). Inputs are built before the clock; results go to the sink.
 */
import { concentrationGrid } from '../src/core/index';
import type { ScreeningModel } from '../src/core/model';
import { contourBands } from '../src/geo/contours';
import { DEFAULT_RULES, batched, localTimer, pairedRatio, timeRounds, type Timing, type TimingRules } from './timing';
import { gridXs, gridYs } from './scenario';

export interface ContourPipelineOptions {
  /** lattice size n × n (256 by default) */
  readonly n?: number;
  readonly z: number;
  /** time, d (Infinity: steady state) */
  readonly t: number;
  /** band thresholds, mg/L; by default three decades below the source concentration */
  readonly thresholds?: readonly number[];
  readonly rules?: TimingRules;
}

export interface ContourPipelineFigure {
  readonly n: number;
  readonly thresholds: readonly number[];
  readonly compute: Timing;
  readonly total: Timing;
  /** total / compute, paired over rounds (timing.ts) */
  readonly ratio: number;
  /** rings drawn (exteriors and holes), from one evaluation */
  readonly rings: number;
}

/** Rings and vertices of every band, so the contour result is consumed. */
function ringsAndVertices(bands: ReturnType<typeof contourBands>): { rings: number; vertices: number } {
  let rings = 0;
  let vertices = 0;
  for (const b of bands)
    for (const poly of b.polygons)
      for (const ring of poly) {
        rings++;
        vertices += ring.length;
      }
  return { rings, vertices };
}

export async function measureContourPipeline(model: ScreeningModel, opts: ContourPipelineOptions): Promise<ContourPipelineFigure> {
  const n = opts.n ?? 256;
  const rules = opts.rules ?? DEFAULT_RULES;
  const xs = gridXs(n);
  const ys = gridYs(n, true);
  const thresholds = opts.thresholds ?? [model.c0 * 1e-1, model.c0 * 1e-2, model.c0 * 1e-3];
  const { z, t } = opts;
  // interleaved, so the ratio sees the same machine load
  const { compute, total } = await timeRounds(
    {
      compute: await batched((calls) => localTimer(() => concentrationGrid(model, xs, ys, z, t), calls)),
      total: await batched((calls) =>
        localTimer(() => {
          const values = concentrationGrid(model, xs, ys, z, t);
          const bands = contourBands({ values, xs, ys, thresholds });
          return ringsAndVertices(bands).vertices + values[values.length >> 1];
        }, calls),
      ),
    },
    rules,
  );
  const rings = ringsAndVertices(contourBands({ values: concentrationGrid(model, xs, ys, z, t), xs, ys, thresholds })).rings;
  return { n, thresholds, compute, total, ratio: pairedRatio(total, compute), rings };
}
