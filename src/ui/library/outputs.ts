/**
 * The files the app writes for the open case, built from the case and the latest results.
 */
import { resultUnit } from '../../case/unitSystem';
import type { Case } from '../../case/schema';
import { serializeCase } from '../../case/io';
import { caseToGeoJSON, geojsonNeedsPlacement } from '../../case/export-geojson';
import { breakthroughCsv, fileStem, receptorTableCsv } from '../../case/export-csv';
import { observationsCsv } from '../../case/export-observations';
import { uncertaintyCsv } from '../../case/export-uncertainty';
import { captureZonesCsv, particleCurvesCsv, particleFiguresCsv } from '../../case/export-wells';
import { particleRunFor } from '../particleState';
import { caseKeyOf, uncertaintyRun } from '../uncertaintyRun';
import { plumeGeoJSON, type Evaluation } from '../results';
import type { ExportParticles, ExportResults } from '../../case/export-results';
import type { OutFile } from './download';
import { APP_VERSION } from './version';

/** Lengths in the exported tables: the case's system (m or ft). */
const fileLengthUnit = (c: Case): 'm' | 'ft' => (resultUnit(c, 'length') === 'ft' ? 'ft' : 'm');

/** `placeOnMap`: refused until the case is placed on the basemap (export-geojson.ts geojsonNeedsPlacement) */
export type Built = { ok: true; file: OutFile } | { ok: false; error: string; placeOnMap?: boolean };

/** Results belong to this case only if they were computed from its current inputs. */
export function resultsFor(c: Case, r: Evaluation | null): Evaluation | null {
  return r && r.caseId === c.id && r.caseStamp === c.modified ? r : null;
}

/** The results in the export layer's shape: the plume's bands as GeoJSON, a complete particle run of this case. */
function forExport(c: Case, r: Evaluation): ExportResults {
  return { ...r, plume: r.plume && { time: r.plume.time, geojson: plumeGeoJSON(r.plume) }, particles: particlesFor(c) };
}

/** A complete particle run of this very case (cancelled or running ones are not exported). */
function particlesFor(c: Case): ExportParticles | null {
  const run = particleRunFor(c, true);
  return run?.receptors ? { particles: run.particles, seed: run.seed, receptors: run.receptors } : null;
}

const NOT_READY = 'Results for the current inputs are not ready yet (or the inputs are not valid); wait for them, then export.';

export function caseFile(c: Case): Built {
  return { ok: true, file: { name: `${fileStem(c)}.case.json`, type: 'application/json', text: serializeCase(c) } };
}

export function geojsonFile(c: Case, r: Evaluation | null): Built {
  // a case on the site grid is refused first, whether or not its results are ready
  const placement = geojsonNeedsPlacement(c);
  if (placement) return { ok: false, error: placement, placeOnMap: true };
  const res = resultsFor(c, r);
  if (!res) return { ok: false, error: `GeoJSON: ${NOT_READY}` };
  // the probability lines of a completed run of the case as it is now
  const run = uncertaintyRun.peek();
  const done = run.status === 'done' && run.result && run.map && run.caseKey === caseKeyOf(c);
  const probability = done ? { contours: run.map!, runs: run.result!.runs, seed: run.result!.seed } : null;
  const out = caseToGeoJSON(c, forExport(c, res), { appVersion: APP_VERSION, probability });
  if (!out.ok) return out;
  return { ok: true, file: { name: `${fileStem(c)}.geojson`, type: 'application/geo+json', text: out.text } };
}

export function receptorCsvFile(c: Case, r: Evaluation | null): Built {
  const res = resultsFor(c, r);
  if (!res) return { ok: false, error: `Receptor table: ${NOT_READY}` };
  return { ok: true, file: { name: `${fileStem(c)}-receptors.csv`, type: 'text/csv', text: receptorTableCsv(forExport(c, res), fileLengthUnit(c)) } };
}

export function curvesCsvFile(c: Case, r: Evaluation | null): Built {
  const res = resultsFor(c, r);
  if (!res) return { ok: false, error: `Breakthrough curves: ${NOT_READY}` };
  if (res.receptors.length === 0) return { ok: false, error: 'Breakthrough curves: the case has no receptors yet.' };
  return { ok: true, file: { name: `${fileStem(c)}-breakthrough.csv`, type: 'text/csv', text: breakthroughCsv(res, fileLengthUnit(c)) } };
}

export function captureZonesCsvFile(c: Case, r: Evaluation | null): Built {
  const res = resultsFor(c, r);
  if (!res) return { ok: false, error: `Capture zones: ${NOT_READY}` };
  if (!res.wells || res.wells.zones.length === 0) return { ok: false, error: 'Capture zones: the case models no pumping well (a receptor that pumps, with its rate, and the saturated thickness).' };
  return { ok: true, file: { name: `${fileStem(c)}-capture-zones.csv`, type: 'text/csv', text: captureZonesCsv(c, res.wells, res.caution) } };
}

const NO_PARTICLES = 'no complete particle run for the current inputs; run it under "What do the pumping wells draw?", then export.';

export function particleCsvFile(c: Case, r: Evaluation | null): Built {
  const res = resultsFor(c, r);
  const p = particlesFor(c);
  if (!res) return { ok: false, error: `Particle figures: ${NOT_READY}` };
  if (!p) return { ok: false, error: `Particle figures: ${NO_PARTICLES}` };
  return { ok: true, file: { name: `${fileStem(c)}-particles.csv`, type: 'text/csv', text: particleFiguresCsv(res, p) } };
}

export function particleCurvesCsvFile(c: Case, r: Evaluation | null): Built {
  const res = resultsFor(c, r);
  const p = particlesFor(c);
  if (!res) return { ok: false, error: `Particle curves: ${NOT_READY}` };
  if (!p) return { ok: false, error: `Particle curves: ${NO_PARTICLES}` };
  return { ok: true, file: { name: `${fileStem(c)}-particle-curves.csv`, type: 'text/csv', text: particleCurvesCsv(res, p) } };
}

export function observationsCsvFile(c: Case): Built {
  if (c.monitoring.results.length === 0) return { ok: false, error: 'Monitoring results: the case has no sampling results yet.' };
  return { ok: true, file: { name: `${fileStem(c)}-monitoring.csv`, type: 'text/csv', text: observationsCsv(c) } };
}

export function uncertaintyCsvFile(c: Case): Built {
  const run = uncertaintyRun.peek();
  if (!run.result || run.status !== 'done' || run.caseKey !== caseKeyOf(c))
    return { ok: false, error: 'Probabilistic results: no completed run for the current inputs; run it under "How sure is it?", then export.' };
  return { ok: true, file: { name: `${fileStem(c)}-probabilities.csv`, type: 'text/csv', text: uncertaintyCsv(run.result, c) } };
}
