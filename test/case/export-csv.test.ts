// CSV export against RFC 4180 §2 (the examples quoted below are from the RFC's text), and the
// common-practice guard against spreadsheet formula injection (OWASP "CSV Injection").
import { describe, expect, it } from 'vitest';
import { breakthroughCsv, csvField, csvRecords, fileStem, receptorTableCsv, RECEPTOR_TABLE_HEADER } from '../../src/case/export-csv';
import { RECEPTOR_WELL_COLUMNS } from '../../src/case/export-wells';
import { demoCase, exportResultsFor, readRfc4180 } from './export-fixture';

describe('RFC 4180 fields and records', () => {
  it('quotes fields with commas, quotes and line breaks, doubling quotes (§2 rules 5–7)', () => {
    expect(csvField('aaa')).toBe('aaa');
    expect(csvField('b"bb')).toBe('"b""bb"'); // RFC 4180 §2.7 example "b""bb"
    expect(csvField('b,bb')).toBe('"b,bb"');
    expect(csvField('b\r\nbb')).toBe('"b\r\nbb"'); // §2.6 example
    expect(csvRecords([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']])).toBe('aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n'); // §2.1–2.2
  });

  it('writes numbers at full precision, and empty for null', () => {
    expect(csvField(0.1 + 0.2)).toBe('0.30000000000000004');
    expect(csvField(1e-12)).toBe('1e-12');
    expect(csvField(null)).toBe('');
    expect(csvField(-3)).toBe('-3'); // numbers are never prefixed
  });

  it('defuses text that a spreadsheet would run as a formula (OWASP; common practice)', () => {
    expect(csvField('=HYPERLINK("http://x")')).toBe('"\'=HYPERLINK(""http://x"")"');
    expect(csvField('+1')).toBe("'+1");
    expect(csvField('@SUM(A1)')).toBe("'@SUM(A1)");
  });

  it('file names keep letters, digits, dot, dash, underscore', () => {
    const c = demoCase('fuel-release-farm-well.json');
    expect(fileStem({ ...c, name: 'Étang road / well #2' })).toBe('Etang-road-well-2');
    expect(fileStem({ ...c, name: '///' })).toBe('case');
  });
});

describe('screening tables', () => {
  const c = demoCase('fuel-release-farm-well.json');
  const r = exportResultsFor(c);

  it('receptor table in US customary units: lengths in ft, named in the headers (issue 13 item 4)', () => {
    const rows = readRfc4180(receptorTableCsv(r, 'ft'));
    expect(rows[0][2]).toBe('distance from source (ft)');
    expect(rows[0][5]).toBe('screen top below water table (ft)');
    expect(rows[0][10]).toBe('at horizon (mg/L)');
    // foot = 0.3048 m exactly (NIST SP 811, Appendix B); 10 significant digits in files
    rows.slice(1, -1).forEach((row, k) => expect(Math.abs((Number(row[2]) * 0.3048) / r.receptors[k].distance - 1)).toBeLessThanOrEqual(5e-10));
  });

  it('receptor table: one record per receptor, every record the same width, values round-trip', () => {
    const rows = readRfc4180(receptorTableCsv(r));
    expect(rows[0]).toEqual([...RECEPTOR_TABLE_HEADER, ...RECEPTOR_WELL_COLUMNS]);
    expect(rows).toHaveLength(1 + r.receptors.length + 1);
    for (const row of rows) expect(row).toHaveLength(RECEPTOR_TABLE_HEADER.length + RECEPTOR_WELL_COLUMNS.length);
    rows.slice(1, -1).forEach((row, k) => {
      expect(row[0]).toBe(r.receptors[k].name);
      // 10 significant digits (src/case/numbers.ts): relative 5e-10 at most
      expect(Math.abs(Number(row[11]) / r.receptors[k].peak.c - 1)).toBeLessThanOrEqual(5e-10);
      const a = r.receptors[k].arrival;
      if (a === null) expect(row[8]).toBe('');
      else expect(Math.abs(Number(row[8]) / a - 1)).toBeLessThanOrEqual(5e-10);
      // every figure names its method: the analytical one here (no well field, no particle run: those columns empty)
      expect(row[RECEPTOR_TABLE_HEADER.indexOf('method')]).toBe('analytical: Domenico 1987 approximation, uniform regional flow (pumping not represented)');
      expect(row.slice(RECEPTOR_TABLE_HEADER.length).every((x) => x === '')).toBe(true);
      for (const cell of row.slice(2, 16)) expect(cell.replace(/^-|\.|e.*$/g, '').replace(/^0+/, '').length, cell).toBeLessThanOrEqual(10);
    });
    expect(rows.at(-1)?.[0]).toBe('screening caution');
    expect(rows.at(-1)?.[1]).toMatch(/Screening-level/);
  });

  it('breakthrough curves: a time column in days and years, one column per receptor', () => {
    const rows = readRfc4180(breakthroughCsv(r));
    expect(rows[0].slice(0, 2)).toEqual(['time (d)', 'time (yr)']);
    expect(rows[0]).toHaveLength(2 + r.receptors.length);
    expect(rows).toHaveLength(1 + r.curveTimes!.length + 1);
    const k = rows.length - 2;
    expect(Number(rows[k][0])).toBe(r.horizon);
    expect(Number(rows[k][1])).toBeCloseTo(r.horizon / 365.25, 12); // Julian year, IAU
    const last = r.receptors[0].curve![r.curveTimes!.length - 1];
    expect(Math.abs(Number(rows[k][2]) / last - 1)).toBeLessThanOrEqual(5e-10); // 10 significant digits
  });

  it('receptor kinds in the words the screen shows, never the codes (issue 13 item 3)', () => {
    const rows = readRfc4180(receptorTableCsv(exportResultsFor(demoCase('solvent-release-creek.json'))));
    const kinds = rows.slice(1, -1).map((row) => row[1]);
    expect(kinds).toContain('Creek, pond or river');
    for (const k of kinds) expect(k).not.toMatch(/^(well|spring|surface-water|property-line|other)$/);
  });

  it('breakthrough curves in a US customary case: each column names its receptor\'s distance in ft (issue 13 item 4)', () => {
    const ft = readRfc4180(breakthroughCsv(r, 'ft'))[0];
    const m = readRfc4180(breakthroughCsv(r))[0];
    const d = r.receptors[0].distance;
    // foot = 0.3048 m exactly (NIST SP 811 (2008), Appendix B); 4 significant digits in a header
    expect(m[2]).toBe(`${r.receptors[0].name}, ${Number(d.toPrecision(4))} m from the source (mg/L, ${r.solution})`);
    expect(ft[2]).toBe(`${r.receptors[0].name}, ${Number((d / 0.3048).toPrecision(4))} ft from the source (mg/L, ${r.solution})`);
    // times and concentrations are the same numbers in both systems (days, mg/L)
    expect(readRfc4180(breakthroughCsv(r, 'ft')).slice(1)).toEqual(readRfc4180(breakthroughCsv(r)).slice(1));
  });

  it("receptor table: the other solution's result and figures beside the chosen one's, and which figures differ", () => {
    const n = exportResultsFor(demoCase('nitrate-field-supply.json'));
    const rows = readRfc4180(receptorTableCsv(n));
    const col = (name: string) => RECEPTOR_TABLE_HEADER.indexOf(name as (typeof RECEPTOR_TABLE_HEADER)[number]);
    const spring = rows.find((row) => row[0] === 'Spring below the lane')!;
    const alt = n.receptors.find((x) => x.name === 'Spring below the lane')!.alternate!;
    expect(spring[col('result')]).toBe('stays below the limit');
    expect(spring[col('other solution')]).toBe('exact');
    expect(spring[col('other solution: result')]).toBe('reaches the limit within the horizon');
    // 10 significant digits (src/case/numbers.ts): relative 5e-10 at most
    expect(Math.abs(Number(spring[col('other solution: first reaches limit (d)')]) / alt.arrival! - 1)).toBeLessThanOrEqual(5e-10);
    expect(Math.abs(Number(spring[col('other solution: peak (mg/L)')]) / alt.peak.c - 1)).toBeLessThanOrEqual(5e-10);
    expect(spring[col('solutions differ in')]).toBe('result; first reaches limit');
    const well = rows.find((row) => row[0] === 'Village supply well')!;
    expect(well[col('solutions differ in')]).toBe('');
  });
});

