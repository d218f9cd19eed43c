/**
 * Importing sampling results from CSV (src/case/observations-import.ts).
 *
 * Outside references: RFC 4180 (quoted fields with the delimiter, doubled quotes and line breaks;
 * CRLF records), ISO 8601 calendar dates (YYYY-MM-DD) and the Gregorian calendar (29 February only
 * in leap years), the exact unit factors of src/core/units.ts (1 µg/L = 1e-3 mg/L; 1 ng/L = 1e-3
 * µg/L). "ppb ≈ µg/L in dilute water" is common practice. Every malformed file listed in issue 17
 * gets a message naming the line and the problem, and the case's monitoring data are unchanged.
 */
import { describe, expect, it } from 'vitest';
import { readCsv } from '../../src/case/csv-read';
import {
  applyImport,
  guessMapping,
  importObservationsCsv,
  parseDate,
  readObservationTable,
  readUnit,
} from '../../src/case/observations-import';
import { DEFAULT_MONITORING, dayNumber, type Monitoring } from '../../src/case/monitoring';
import { migrateCase } from '../../src/case/migrate';
import { newCase } from '../../src/case/defaults';

const empty = (): Monitoring => structuredClone(DEFAULT_MONITORING);

const GOOD = [
  'Location ID,Sample Date,Parameter,Result,Units,Qualifier',
  'MW-1,2021-03-14,Benzene,0.52,mg/L,',
  'MW-1,2021-06-10,Benzene,410,ug/L,',
  'MW-2,2021-03-14,Benzene,<0.005,mg/L,',
  'MW-2,2021-06-10,Benzene,0.005,mg/L,U',
  '"MW-3, deep",2021-03-15,Benzene,2.5,ppb,J',
].join('\r\n');

describe('RFC 4180 reading', () => {
  it('quoted delimiters, doubled quotes, line breaks inside quotes; record line numbers', () => {
    const r = readCsv('a,b\r\n"x, y","he said ""hi"""\r\n"two\nlines",z\n\nlast,1', ',');
    expect(r.map((x) => x.line)).toEqual([1, 2, 3, 6]);
    expect(r[1].fields).toEqual(['x, y', 'he said "hi"']);
    expect(r[2].fields).toEqual(['two\nlines', 'z']);
  });

  it('an unclosed quote names the line its field began on', () => {
    const t = readObservationTable('well,date,analyte,value,unit\nMW-1,2021-01-01,"Benzene,1,mg/L\nMW-2,2021-01-01,Benzene,1,mg/L');
    expect(t.ok).toBe(false);
    expect(!t.ok && t.problem).toMatch(/^line 2: a quoted field is never closed/);
  });
});

describe('cells', () => {
  it('dates in the common formats (ISO 8601; day first with dots; slashes by the file\'s order; month names)', () => {
    const d = dayNumber('2021-03-14');
    for (const s of ['2021-03-14', '2021/3/14', '2021-03-14T10:30:00Z', '14.03.2021', '14 Mar 2021', '14-Mar-2021', 'March 14, 2021', '2021-03-14 08:15'])
      expect(parseDate(s, null), s).toBe(d);
    expect(parseDate('14/03/2021', 'dmy')).toBe(d);
    expect(parseDate('03/14/2021', 'mdy')).toBe(d);
    expect(parseDate('03/04/2021', null)).toMatch(/day\/month or month\/day/);
    expect(parseDate('2021-02-29', null)).toMatch(/not a real calendar date/); // 2021 is not a leap year
    expect(parseDate('2020-02-29', null)).toBe(dayNumber('2020-02-29'));
    expect(parseDate('14/03/21', 'dmy')).toMatch(/two digits/);
    expect(parseDate('last Tuesday', null)).toMatch(/not a date/);
  });

  it('units: exact factors, any letter case, µ or u', () => {
    expect(readUnit('MG/L')).toEqual(['mg/L', 1]);
    expect(readUnit('µg/l')).toEqual(['ug/L', 1]);
    expect(readUnit('ng/L')).toEqual(['ug/L', 1e-3]);
    expect(readUnit('ppb')).toEqual(['ug/L', 1]);
    expect(readUnit('pCi/L')).toBeNull();
  });

  it('header names map to roles', () => {
    const m = guessMapping(['Location ID', 'Sample Date', 'Parameter', 'Result', 'Units', 'Qualifier', 'RL', 'Easting', 'Northing']);
    expect(m).toMatchObject({ well: 0, date: 1, analyte: 2, value: 3, unit: 4, qualifier: 5, limit: 6, x: 7, y: 8 });
  });
});

describe('a good file', () => {
  it('imports every row, keeps "<" results as non-detects at their limit, converts units, creates wells', () => {
    const imp = importObservationsCsv(GOOD, empty());
    expect(imp.fatal).toBeNull();
    expect(imp.problems).toEqual([]);
    expect(imp.newWells.map((w) => w.name)).toEqual(['MW-1', 'MW-2', 'MW-3, deep']);
    expect(imp.results).toHaveLength(5);
    expect(imp.results[1]).toMatchObject({ value: 410, unit: 'ug/L', nonDetect: false });
    expect(imp.results[2]).toMatchObject({ value: 0.005, unit: 'mg/L', nonDetect: true });
    expect(imp.results[3]).toMatchObject({ value: 0.005, nonDetect: true }); // qualifier U
    expect(imp.results[4]).toMatchObject({ value: 2.5, unit: 'ug/L', nonDetect: false }); // J = detected, estimated
    expect(imp.notes.join(' ')).toMatch(/ppb/);
    const m = applyImport(empty(), imp);
    // the imported data pass the case schema
    const c = migrateCase(JSON.parse(JSON.stringify({ ...newCase(), monitoring: m })));
    expect(c.monitoring.results).toHaveLength(5);
  });

  it('semicolons with decimal commas, a reporting-limit column and ND words', () => {
    const text = 'Messstelle;Datum;Stoff;Wert;Einheit;RL\nGWM 1;14.03.2021;Benzol;0,52;mg/l;0,001\nGWM 1;10.06.2021;Benzol;n.d.;mg/l;0,001\n';
    const imp = importObservationsCsv(text, empty(), { mapping: { well: 0, date: 1, analyte: 2, value: 3, unit: 4, limit: 5 } });
    expect(imp.problems).toEqual([]);
    expect(imp.results.map((r) => [r.value, r.nonDetect])).toEqual([[0.52, false], [0.001, true]]);
  });
});

describe('malformed files: a message naming the line and the problem; the case unchanged', () => {
  const start = (): Monitoring => applyImport(empty(), importObservationsCsv(GOOD, empty()));

  function check(text: string, expected: RegExp, options = {}) {
    const before = start();
    const snapshot = JSON.stringify(before);
    const imp = importObservationsCsv(text, before, options);
    const messages = [imp.fatal ?? '', ...imp.problems.map((p) => `line ${p.line}: ${p.message}`)].join('\n');
    expect(messages).toMatch(expected);
    // nothing is applied until the user accepts; the input object itself is never modified
    expect(JSON.stringify(before)).toBe(snapshot);
    return { imp, before };
  }

  it('wrong delimiter (the file uses semicolons, comma chosen)', () => {
    check('well;date;analyte;value;unit\nMW-1;2021-01-01;Benzene;1;mg/L', /line 1: no comma between the column names; the file seems to use the semicolon/, { delimiter: ',' });
  });

  it('a row that switches delimiter is reported, the others kept', () => {
    const { imp } = check('well,date,analyte,value,unit\nMW-1,2021-01-01,Benzene,1,mg/L\nMW-1;2021-02-01;Benzene;2;mg/L\n', /line 3: has 1 field where the header has 5 \(it seems to use the semicolon/);
    expect(imp.results).toHaveLength(1);
  });

  it('unknown units', () => {
    const { imp } = check('well,date,analyte,value,unit\nMW-1,2021-01-01,Benzene,1,mg/L\nMW-1,2021-02-01,Benzene,3,pCi/L', /line 3: the unit "pCi\/L" is not a concentration unit/);
    expect(imp.results).toHaveLength(1);
  });

  it('dates that do not parse', () => {
    check('well,date,analyte,value,unit\nMW-1,2021-13-01,Benzene,1,mg/L\nMW-1,soon,Benzene,1,mg/L', /line 2: .*"2021-13-01" is not a real calendar date[\s\S]*line 3: .*"soon" is not a date/);
  });

  it('text in the value column', () => {
    check('well,date,analyte,value,unit\nMW-1,2021-01-01,Benzene,pending,mg/L', /line 2: the result "pending" \("value"\) is not a number/);
  });

  it('duplicated rows (within the file, and rows already in the case)', () => {
    const { imp } = check(
      'well,date,analyte,value,unit\nMW-9,2022-01-01,Benzene,1,mg/L\nMW-9,2022-01-01,Benzene,1,mg/L\nMW-1,2021-03-14,Benzene,0.52,mg/L',
      /line 3: repeats line 2[\s\S]*line 4: this result is already in the case/,
    );
    expect(imp.results).toHaveLength(1);
  });

  it('an empty file, and a header without rows', () => {
    check('', /the file is empty/);
    check('\ufeff  \r\n', /the file is empty/);
    check('well,date,analyte,value,unit\r\n', /line 1: the header has no rows/);
  });

  it('a 50 MB file is refused before it is read, with its size', () => {
    const row = 'MW-1,2021-01-01,Benzene,1,mg/L\n';
    const big = 'well,date,analyte,value,unit\n' + row.repeat(Math.ceil((50 * 1024 * 1024) / row.length));
    check(big, /the file is 50\.0 MB, larger than the 5\.0 MB accepted/);
  });

  it('slash dates that never settle day/month order stop the import and ask for the order', () => {
    check('well,date,analyte,value,unit\nMW-1,03/04/2021,Benzene,1,mg/L\nMW-1,05/06/2021,Benzene,1,mg/L', /"03\/04\/2021" could be day\/month or month\/day .*choose the date order/);
    const ok = importObservationsCsv('well,date,analyte,value,unit\nMW-1,03/04/2021,Benzene,1,mg/L', empty(), { dateOrder: 'dmy' });
    expect(ok.results[0].date).toBe('2021-04-03');
  });

  it('a missing column stops the import and names it', () => {
    check('well,date,value\nMW-1,2021-01-01,1', /choose the column for: analyte .*unit/);
  });

  it('a non-detect word without a limit, a negative value', () => {
    check('well,date,analyte,value,unit\nMW-1,2021-01-01,Benzene,ND,mg/L\nMW-1,2021-02-01,Benzene,-1,mg/L', /line 2: "ND" is below the reporting limit, but no limit is given[\s\S]*line 3: .*negative/);
  });
});
