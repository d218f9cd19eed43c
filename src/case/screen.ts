/**
 * Whole-case screening: prepare the case, evaluate every receptor against the limit over the
 * horizon (core evaluateReceptor: arrival at the limit, concentration at the horizon, peak,
 * steady state, and the other solution's figures beside them), the plume length at the limit
 * along the centreline at the map depth, all warnings, and the caution that goes with results.
 */
import type { Case } from './schema';
import { prepareCase, type PreparedCase, type PreparedReceptor } from './prepare';
import { evaluateReceptor, plumeLength, type ReceptorResult, type Warning } from '../core';
import { SCREENING_CAUTION } from './caution';
import { inWordsOf } from './checked';
import { prepareCaseWells, wellCaptures, type CaseWells, type WellCapture } from './wells';

export interface ScreenedReceptor {
  readonly receptor: PreparedReceptor;
  readonly result: ReceptorResult;
}

export interface ScreeningResult {
  readonly prepared: PreparedCase;
  readonly results: ScreenedReceptor[];
  /** centreline distance (m) to the limit at the map depth: at the view time, and at steady state
   * (null: the source itself is below the limit) */
  readonly plumeLength: { atViewTime: number | null; steady: number | null };
  readonly warnings: Warning[];
  readonly caution: string;
  /** the steady well field (pumping wells with rates, boundary lines) and each well's capture of the source */
  readonly wells: CaseWells;
  readonly captures: WellCapture[];
}

/** The whole screening of a case; a refusal names the case field in the screen's words (checked.ts `inCaseWords`). */
export function screenCase(c: Case): ScreeningResult {
  return inWordsOf(c, () => screenChecked(c));
}

function screenChecked(c: Case): ScreeningResult {
  const prepared = prepareCase(c);
  const { model, limit, horizon, depth, viewTime } = prepared;
  const warnings: Warning[] = [...prepared.warnings];
  const results = prepared.receptors.map((receptor, i) => {
    const result = evaluateReceptor(model, { ...receptor, label: receptor.name || receptor.id }, limit, horizon);
    for (const w of result.warnings) warnings.push({ ...w, field: w.field ?? `site.receptors[${i}]` });
    return { receptor, result };
  });
  const steady = plumeLength(model, limit, depth, Infinity);
  const atViewTime = viewTime === Infinity ? steady : plumeLength(model, limit, depth, viewTime);
  const wells = prepareCaseWells(c, prepared);
  warnings.push(...wells.warnings);
  const captures = wellCaptures(prepared, wells);
  return { prepared, results, plumeLength: { atViewTime, steady }, warnings: dedupe(warnings), caution: SCREENING_CAUTION, wells, captures };
}

/** One warning per code and field (the model-level and receptor-level checks overlap). */
function dedupe(ws: Warning[]): Warning[] {
  const seen = new Set<string>();
  return ws.filter((w) => {
    const k = w.field ? `${w.code}|${w.field}` : `${w.code}||${w.message}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}
