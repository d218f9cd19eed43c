// Builds the export input for a demo case straight from the engine (screenCase, breakthroughCurve,
// concentrationGrid) and the geo contours, the way the app's worker does, so the export tests run
// on real results rather than hand-made ones.
import { readFileSync } from 'node:fs';
import { screenCase } from '../../src/case/screen';
import { breakthroughCurve, concentrationGrid } from '../../src/core';
import { contourBands, contoursToGeoJSON } from '../../src/geo/contours';
import { migrateCase } from '../../src/case/migrate';
import type { Case } from '../../src/case/schema';
import type { ExportResults } from '../../src/case/export-results';

export function demoCase(file: string): Case {
  return migrateCase(JSON.parse(readFileSync(`cases/${file}`, 'utf8')));
}

export function exportResultsFor(c: Case, n = 64): ExportResults {
  const s = screenCase(c);
  const { model, limit, horizon, depth, viewTime } = s.prepared;
  const curveTimes = Array.from({ length: 25 }, (_, i) => (horizon * (i + 1)) / 25);
  const L = Math.max(s.plumeLength.steady ?? 0, ...s.prepared.receptors.map((r) => r.x), 50) * 1.2;
  const xs = Array.from({ length: n }, (_, i) => (L * (i + 0.5)) / n);
  const halfW = Math.max(L / 4, model.width);
  const ys = Array.from({ length: n }, (_, j) => -halfW + (2 * halfW * j) / (n - 1));
  const grid = concentrationGrid(model, xs, ys, depth, viewTime);
  const bands = contourBands({ values: grid, xs, ys, thresholds: [limit, limit * 10] });
  return {
    solution: model.solution,
    limit,
    horizon,
    curveTimes,
    receptors: s.results.map(({ receptor, result }) => ({
      id: receptor.id,
      name: receptor.name,
      kind: receptor.kind,
      x: receptor.x,
      y: receptor.y,
      zTop: receptor.zTop,
      zBottom: receptor.zBottom,
      distance: receptor.distance,
      arrival: result.arrival,
      atHorizon: result.atHorizon,
      peak: result.peak,
      steady: result.steady,
      status: result.status,
      alternate: result.alternate,
      curve: breakthroughCurve(model, receptor, curveTimes),
      curveAlternate: null,
    })),
    plumeLength: s.plumeLength.atViewTime,
    plume: { time: viewTime, geojson: contoursToGeoJSON(bands, s.prepared.toMap) },
    caution: s.caution,
  };
}

/** A reader written from RFC 4180's ABNF (file = record *(CRLF record) [CRLF]). */
export function readRfc4180(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let i = 0;
  while (i < text.length) {
    let field = '';
    if (text[i] === '"') {
      i++;
      for (;;) {
        if (i >= text.length) throw new Error('unterminated quoted field');
        if (text[i] === '"' && text[i + 1] === '"') {
          field += '"';
          i += 2;
        } else if (text[i] === '"') {
          i++;
          break;
        } else field += text[i++];
      }
    } else {
      while (i < text.length && text[i] !== ',' && text[i] !== '\r') {
        if (text[i] === '"' || text[i] === '\n') throw new Error(`bare ${JSON.stringify(text[i])} in unquoted field at ${i}`);
        field += text[i++];
      }
    }
    row.push(field);
    if (text[i] === ',') i++;
    else if (text.startsWith('\r\n', i)) {
      rows.push(row);
      row = [];
      i += 2;
    } else if (i < text.length) throw new Error(`unexpected ${JSON.stringify(text[i])} at ${i}`);
  }
  if (row.length) rows.push(row);
  return rows;
}
