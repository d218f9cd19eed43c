/**
 * Words and files that name lengths follow the case's unit system (issue 13 item 4): the fit's
 * longitudinal dispersivity in ft in a US customary case (the fit works in metres), and the
 * observations CSV's screen depths in metres whatever unit they were typed in (the observation
 * import reads those columns as metres, so the file re-imports to the same wells). Factor: NIST SP
 * 811 (2008) Appendix B, ft = 0.3048 m exactly.
 */
import { describe, expect, test } from 'vitest';
import { readFileSync } from 'node:fs';
import { fitLines } from '../../src/case/observations-text';
import type { FitResult } from '../../src/case/fit';
import { observationsCsv } from '../../src/case/export-observations';
import { migrateCase } from '../../src/case/migrate';
import { readRfc4180 } from './export-fixture';

const fit: FitResult = {
  values: [{ parameter: 'longitudinalDispersivity', start: 30.48, value: 3.048, interval: [1.524, 6.096], standardError: 1.2 }],
  confidence: 0.95,
  residuals: [],
  rmsLn: 0.5,
  startRmsLn: 1,
  detected: 12,
  nonDetects: 2,
  converged: true,
  iterations: 9,
  warnings: [],
};

describe('lengths in words and files', () => {
  test('the fitted αL reads in m in an SI case and in ft in a US customary one', () => {
    expect(fitLines(fit)[0]).toBe('longitudinal dispersivity: 3.05 m (case: 30.5, 95 % interval 1.52 to 6.1)');
    // 3.048 m = 10 ft, 30.48 m = 100 ft, 1.524–6.096 m = 5–20 ft
    expect(fitLines(fit, { units: { system: 'US', fields: {} } })[0]).toBe('longitudinal dispersivity: 10 ft (case: 100, 95 % interval 5 to 20)');
  });

  test('the observations CSV writes a screen typed in ft as metres (30 ft = 9.144 m)', () => {
    const c = migrateCase(JSON.parse(readFileSync('cases/depot-benzene-monitoring.json', 'utf8')));
    c.monitoring.wells[0].screenTop = { value: 10, unit: 'ft' };
    c.monitoring.wells[0].screenBottom = { value: 30, unit: 'ft' };
    c.units = { system: 'US', fields: {} };
    const rows = readRfc4180(observationsCsv(c));
    const h = rows[0];
    const row = rows.find((r) => r[0] === c.monitoring.wells[0].name)!;
    expect(Number(row[h.indexOf('screen top (m below water table)')])).toBeCloseTo(3.048, 12);
    expect(Number(row[h.indexOf('screen bottom (m below water table)')])).toBeCloseTo(9.144, 12);
  });
});
