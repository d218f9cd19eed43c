/**
 * The command line end to end: builds dist-cli/screen.mjs with scripts/build-cli.mjs, runs it on
 * the demo cases in every format, and checks exit codes and messages for bad input. The figures
 * printed are compared with screenCase run in-process on the same file (the CLI must print the
 * engine's numbers, not its own).
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseCaseFile } from '../../src/case/io';
import { screenCase } from '../../src/case/screen';
import { SCREENING_CAUTION } from '../../src/case/caution';
import { runUncertainty, UNCERTAINTY_CAUTION } from '../../src/case/uncertainty';

const CLI = 'dist-cli/screen.mjs';
let dir: string;

function run(...args: string[]) {
  const r = spawnSync(process.execPath, [CLI, ...args], { encoding: 'utf8', timeout: 60_000 });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

beforeAll(() => {
  execFileSync(process.execPath, ['scripts/build-cli.mjs', '--quiet'], { stdio: 'inherit' });
  dir = mkdtempSync(join(tmpdir(), 'dg-cli-'));
}, 120_000);

function writeCase(name: string, body: string | Buffer): string {
  const p = join(dir, name);
  writeFileSync(p, body);
  return p;
}

const demo = (f: string) => `cases/${f}.json`;
const screened = (f: string) => {
  const r = parseCaseFile(readFileSync(f, 'utf8'));
  if (!r.ok) throw new Error(r.errors.join('; '));
  return screenCase(r.case);
};

describe('formats', () => {
  test('table: sections, units, receptor rows and the caution', () => {
    const { code, out, err } = run(demo('fuel-release-farm-well'));
    expect(err).toBe('');
    expect(code).toBe(0);
    for (const s of ['Derived parameters', 'seepage velocity v = K·i/nₑ', 'retardation R = 1 + ρb·Kd/n', 'dispersivity αL / αT / αV', 'Xu & Eckstein 1995', 'Receptors', 'Warnings', 'CAUTION']) expect(out).toContain(s);
    for (const unit of ['m/d', 'x (m)', 'C at horizon (mg/L)', 'peak (mg/L) at (yr)', 'arrival at limit']) expect(out).toContain(unit);
    expect(out).toContain('Farm supply well');
    expect(out).toContain("Neighbour's garden well");
    expect(out.replace(/\s+/g, ' ')).toContain(SCREENING_CAUTION);
    // the seepage velocity printed is the engine's: 12 m/d × 0.004 / 0.25 = 0.192 m/d
    expect(out).toMatch(/seepage velocity v = K·i\/nₑ\s+0\.192 m\/d/);
  });

  test('table: the other solution is printed where it differs by more than 5 %', () => {
    const s = screened(demo('fuel-release-farm-well'));
    const differing = s.results.filter((r) => (r.result.alternate?.relDiff ?? 0) > 0.05);
    expect(differing.length).toBeGreaterThan(0); // this demo case has such receptors
    const { out } = run(demo('fuel-release-farm-well'));
    expect(out).toContain('Where the other solution gives another result, or any figure differs by more than 5 %');
    for (const r of differing) expect(out).toContain(`${r.receptor.name}: exact rectangular-source solution: `);
  });

  test('table and csv: a receptor whose result differs between the solutions shows both (nitrate demo: the spring)', () => {
    const { out } = run(demo('nitrate-field-supply'));
    expect(out).toMatch(/Spring below the lane: exact rectangular-source solution: REACHES THE LIMIT WITHIN THE HORIZON, arrival 4\.\d+ yr/);
    expect(out.replace(/\s+/g, ' ')).toMatch(/- Spring below the lane: the Domenico approximation stays below the limit, the exact solution reaches the limit/);
    const csv = run(demo('nitrate-field-supply'), '--format=csv').out.split('\r\n');
    const head = csv[0].split(',');
    const spring = csv.find((l) => l.includes('Spring below the lane'))!.split(',');
    expect(spring[head.indexOf('other_status')]).toBe('reaches-limit');
    expect(spring[head.indexOf('solutions_differ_in')]).toBe('status arrival');
  });

  test('json: the engine figures in internal units, with units, warnings, caution and assumptions', () => {
    const { code, out } = run(demo('solvent-release-creek'), '--format', 'json');
    expect(code).toBe(0);
    const j = JSON.parse(out);
    const s = screened(demo('solvent-release-creek'));
    expect(j.units).toMatchObject({ length: 'm', time: 'd', concentration: 'mg/L' });
    expect(j.receptors).toHaveLength(s.results.length);
    j.receptors.forEach((r: any, i: number) => {
      const e = s.results[i];
      expect(r.name).toBe(e.receptor.name);
      expect(r.x).toBe(e.receptor.x);
      expect(r.arrival).toBe(e.result.arrival);
      expect(r.atHorizon).toBe(e.result.atHorizon);
      expect(r.peak).toEqual(e.result.peak);
      expect(r.status).toBe(e.result.status);
      expect(r.alternate?.solution).toBe(e.result.alternate?.solution);
    });
    expect(j.derived.v).toBe(s.prepared.derived.v);
    expect(j.derived.R).toBe(s.prepared.derived.R);
    expect(j.caution).toBe(SCREENING_CAUTION);
    expect(j.assumptions.length).toBeGreaterThan(5);
    expect(j.model.duration).toBeNull(); // continuous release: Infinity is written as null in JSON
  });

  test('csv: a header with units, one row per receptor, the caution as the last record', () => {
    const { code, out } = run(demo('v1-compact-example'), '--format=csv');
    expect(code).toBe(0);
    expect(out.endsWith('\r\n')).toBe(true);
    const rows = out.split('\r\n').filter(Boolean);
    const header = rows[0].split(',');
    expect(header).toContain('arrival_d');
    expect(header).toContain('c_horizon_mg_per_L');
    expect(header).toContain('x_m');
    const s = screened(demo('v1-compact-example'));
    expect(rows).toHaveLength(1 + s.results.length + 1);
    const last = rows[rows.length - 1];
    expect(last.startsWith('screening caution,"Screening-level estimates only.')).toBe(true);
    // RFC 4180: every record has the header's number of fields; a name with a comma is quoted
    // a minimal RFC 4180 field splitter for one record (no embedded line breaks in these rows)
    const split = (row: string) => {
      const out: string[] = [];
      let cur = '';
      let quoted = false;
      for (let i = 0; i < row.length; i++) {
        const ch = row[i];
        if (quoted) {
          if (ch === '"' && row[i + 1] === '"') (cur += '"'), i++;
          else if (ch === '"') quoted = false;
          else cur += ch;
        } else if (ch === '"') quoted = true;
        else if (ch === ',') out.push(cur), (cur = '');
        else cur += ch;
      }
      out.push(cur);
      return out;
    };
    for (const r of rows) expect(split(r)).toHaveLength(header.length);
    expect(rows[1]).toContain('"House well, Orchard Lane"');
    const cells = split(rows[1]);
    expect(Number(cells[header.indexOf('c_horizon_mg_per_L')])).toBe(s.results[0].result.atHorizon);
    expect(Number(cells[header.indexOf('x_m')])).toBe(s.results[0].receptor.x);
  });

  test('a US customary case: table and csv in ft and ft/d, json in the fixed units (issue 13 item 4)', () => {
    const c = JSON.parse(readFileSync(demo('fuel-release-farm-well'), 'utf8'));
    c.units = { system: 'US', fields: {} };
    const f = writeCase('us.json', JSON.stringify(c));
    const s = screened(demo('fuel-release-farm-well'));
    // foot = 0.3048 m exactly (NIST SP 811 (2008), Appendix B)
    const table = run(f);
    expect(table.code).toBe(0);
    expect(table.out).toContain('Units: US customary');
    expect(table.out).toContain('x (ft)');
    // 0.192 m/d (the SI table test above) = 0.192 / 0.3048 = 0.630 ft/d
    expect(table.out).toMatch(/seepage velocity v = K·i\/nₑ\s+0\.63 ft\/d/);
    expect(table.out).not.toMatch(/\bm\/d\b/);
    const rows = run(f, '--format', 'csv').out.split('\r\n').filter(Boolean);
    const header = rows[0].split(',');
    expect(header).toContain('x_ft');
    expect(header).not.toContain('x_m');
    const x = Number(rows[1].split(',')[header.indexOf('x_ft')]);
    expect(Math.abs((x * 0.3048) / s.results[0].receptor.x - 1)).toBeLessThan(1e-12);
    // the probabilistic run's distributions in the case's system (the demo's K lognormal about 12 m/d = 39.37 ft/d)
    const mc = run(f, '--runs', '50');
    expect(mc.code).toBe(0);
    expect(mc.out).toMatch(/- Hydraulic conductivity K: lognormal, median 39\.37 ft\/d/);
    expect(mc.out).not.toMatch(/\bm\/d\b/);
    const mcCsv = run(f, '--runs', '50', '--format', 'csv').out;
    expect(mcCsv).toMatch(/uncertain input,Hydraulic conductivity K,"?lognormal, median 39\.37 ft\/d/);
    // JSON: the contract's fixed units (m, d, mg/L) whatever the case's system
    const j = JSON.parse(run(f, '--format', 'json').out);
    expect(j.units.length).toBe('m');
    expect(JSON.stringify(j)).not.toContain('"ft"');
  });

  test('every demo case screens in every format (exit 0)', () => {
    for (const f of ['fuel-release-farm-well', 'solvent-release-creek', 'nitrate-field-supply', 'v1-compact-example'])
      for (const fmt of ['table', 'json', 'csv']) expect(run(demo(f), '--format', fmt).code, `${f} ${fmt}`).toBe(0);
  });

  test('--help', () => {
    const { code, out } = run('--help');
    expect(code).toBe(0);
    expect(out).toMatch(/Usage:/);
    expect(out).toMatch(/--format table\|json\|csv/);
    expect(out).toMatch(/Exit codes/);
  });
});

describe('bad input: non-zero exit and a message naming the problem', () => {
  test('usage errors exit 2', () => {
    expect(run().code).toBe(2);
    expect(run().err).toMatch(/no case file given/);
    const bad = run(demo('v1-compact-example'), '--format', 'xml');
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--format must be table, json or csv \(got "xml"\)/);
    expect(run('--verbose', 'a.json').err).toMatch(/unknown option --verbose/);
    expect(run('a.json', 'b.json').err).toMatch(/only one case file/);
  });

  test('missing file and directory exit 3', () => {
    const r = run(join(dir, 'no-such-case.json'));
    expect(r.code).toBe(3);
    expect(r.err).toMatch(/cannot read .*no-such-case\.json: no such file/);
    const d = run(dir);
    expect(d.code).toBe(3);
    expect(d.err).toMatch(/is a directory/);
  });

  // issue 14 item 6: the app's reading rule (src/case/text.ts, tested on its own in test/case/text.test.ts)
  test('text encodings: UTF-16 with a mark is read; Windows-1252, overlong UTF-8 and a doubled mark are refused (exit 4)', () => {
    const text = readFileSync(demo('nitrate-field-supply'), 'utf8');
    const u16 = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]);
    const ok = run(writeCase('utf16.json', u16), '--format', 'json');
    expect(ok.code).toBe(0);
    const same = (out: string) => ({ ...JSON.parse(out), case: { ...JSON.parse(out).case, file: '' } });
    expect(same(ok.out)).toEqual(same(run(demo('nitrate-field-supply'), '--format', 'json').out));
    const cp1252 = Buffer.from(text.replace('"notes": "', '"notes": "\u00b5'), 'latin1');
    const r1 = run(writeCase('cp1252.json', cp1252));
    expect(r1.code).toBe(4);
    expect(r1.err).toMatch(/not UTF-8 text \(byte \d+ cannot be read as UTF-8; it may be in a Windows or Latin-1 encoding\)/);
    const overlong = Buffer.concat([Buffer.from(text.slice(0, 20)), Buffer.from([0xc0, 0xaf]), Buffer.from(text.slice(20))]);
    expect(run(writeCase('overlong.json', overlong)).code).toBe(4);
    const twoMarks = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf, 0xef, 0xbb, 0xbf]), Buffer.from(text)]);
    expect(run(writeCase('two-marks.json', twoMarks)).err).toMatch(/begins with two byte-order marks/);
  });

  test('not JSON, wrong format, future version, schema field: exit 4 with the reason', () => {
    const notJson = run(writeCase('broken.json', '{ "format": '));
    expect(notJson.code).toBe(4);
    expect(notJson.err).toMatch(/the case file is cut short or damaged: its text ends before the case is complete/);
    const foreign = run(writeCase('foreign.json', JSON.stringify({ type: 'FeatureCollection', features: [] })));
    expect(foreign.code).toBe(4);
    expect(foreign.err).toMatch(/format is missing/);
    const future = run(writeCase('future.json', JSON.stringify({ format: 'downgradient-case', version: 7 })));
    expect(future.code).toBe(4);
    expect(future.err).toMatch(/version 7 is newer/);
    const v1 = JSON.parse(readFileSync(demo('v1-compact-example'), 'utf8'));
    v1.aquifer.K = 'fast';
    const schema = run(writeCase('schema.json', JSON.stringify(v1)));
    expect(schema.code).toBe(4);
    expect(schema.err).toMatch(/aquifer\.K: expected a number, got "fast"/);
    expect(schema.out).toBe('');
  });

  test('a value outside its range: exit 5 naming the case field and the accepted range', () => {
    const v1 = JSON.parse(readFileSync(demo('v1-compact-example'), 'utf8'));
    v1.aquifer.effectivePorosity = 1.25;
    const r = run(writeCase('range.json', JSON.stringify(v1)));
    expect(r.code).toBe(5);
    expect(r.err).toMatch(/Effective porosity nₑ 1\.25 is not accepted: enter a value above 0 and below 1/);
    expect(r.err).toMatch(/field: aquifer\.effectivePorosity/);
    expect(r.out).toBe('');
  });
});

// Probabilistic screening (--runs, --seed): the JSON shape issue 15 fixes, the figures identical to
// src/case/uncertainty.ts run in-process on the same case, seed and runs (the app runs the same
// code), "not within the horizon" as null, and refusals with exit code 5.
const caseOf = (f: string) => {
  const r = parseCaseFile(readFileSync(f, 'utf8'));
  if (!r.ok) throw new Error(r.errors.join('; '));
  return r.case;
};

describe('npm run screen -- case.json --runs N --seed S', () => {
  test('json: each receptor carries exactly the promised uncertainty object, equal to the in-process run', () => {
    const file = 'cases/nitrate-field-supply.json';
    const { code, out, err } = run(file, '--runs', '400', '--seed', '17', '--format', 'json');
    expect(err).toBe('');
    expect(code).toBe(0);
    const json = JSON.parse(out);
    const expected = runUncertainty(caseOf(file), { runs: 400, seed: 17 });
    json.receptors.forEach((r: { uncertainty: Record<string, unknown> }, j: number) => {
      const u = r.uncertainty;
      expect(Object.keys(u)).toEqual(['runs', 'seed', 'pExceed', 'pExceedSE', 'arrival', 'concentrationAtHorizon', 'peak', 'drivers']);
      const e = expected.receptors[j];
      expect(u).toEqual({
        runs: 400,
        seed: 17,
        pExceed: e.pExceed,
        pExceedSE: e.pExceedSE,
        arrival: e.arrival,
        concentrationAtHorizon: e.concentrationAtHorizon,
        peak: e.peak,
        drivers: e.drivers.map((d) => ({ input: d.input, rankCorrelation: d.rankCorrelation, pExceedLowThird: d.pExceedLowThird, pExceedHighThird: d.pExceedHighThird })),
      });
      for (const p of ['arrival', 'concentrationAtHorizon', 'peak']) expect(Object.keys(u[p] as object)).toEqual(['p5', 'p50', 'p95']);
    });
    // the village well never reaches 10 mg/L in this demo: every arrival percentile is null, P = 0
    const village = json.receptors[0].uncertainty;
    expect(village.pExceed).toBe(0);
    expect(village.arrival).toEqual({ p5: null, p50: null, p95: null });
    expect(json.uncertainty.inputs.map((i: { input: string }) => i.input)).toEqual(['hydraulicConductivity', 'effectivePorosity', 'dispersivityFactor', 'sourceConcentration']);
    expect(json.uncertainty.caution).toContain(UNCERTAINTY_CAUTION);
    expect(json.uncertainty.caution).toContain(SCREENING_CAUTION);
    expect(json.uncertainty.caution).toContain('400 Monte Carlo realisations (Latin hypercube, seed 17');
  });

  test('the seed and run count reproduce a run; the case file\'s seed is used when only --runs is given', () => {
    const a = run('cases/fuel-release-farm-well.json', '--runs', '200', '--format', 'json');
    const b = run('cases/fuel-release-farm-well.json', '--runs', '200', '--seed', '20261203', '--format', 'json');
    expect(a.code).toBe(0);
    expect(JSON.parse(a.out).receptors.map((r: { uncertainty: unknown }) => r.uncertainty)).toEqual(JSON.parse(b.out).receptors.map((r: { uncertainty: unknown }) => r.uncertainty));
  });

  test('table and csv carry the probabilities, the distributions, seed, runs and the caution', () => {
    const t = run('cases/fuel-release-farm-well.json', '--runs', '200', '--seed', '3');
    expect(t.code).toBe(0);
    for (const s of ['Probabilistic screening: 200 realisations, seed 3', 'lognormal, median 12 m/d, geometric standard deviation 3', 'P(reaches limit within horizon)', 'Which measurement would settle it', 'in its low third', 'To narrow it: slug or pumping tests'])
      expect(t.out).toContain(s);
    expect(t.out.replace(/\s+/g, ' ')).toContain(UNCERTAINTY_CAUTION);
    const c = run('cases/fuel-release-farm-well.json', '--runs', '200', '--seed', '3', '--format', 'csv');
    expect(c.code).toBe(0);
    const lines = c.out.split('\r\n');
    expect(lines[0]).toContain('mc_runs,mc_seed,p_exceed,p_exceed_se,p_exceed_low95,p_exceed_high95,arrival_p5_d');
    expect(c.out).toContain('uncertain input,Hydraulic conductivity K,"lognormal, median 12 m/d, geometric standard deviation 3"');
    expect(c.out).toContain('probabilistic caution');
  });

  test.each([
    [['--runs', '0'], 5, /uncertainty\.runs = 0 is not accepted: must be a whole number of realisations from 1 to 50000/],
    [['--seed', '1.5'], 5, /uncertainty\.seed = 1\.5 is not accepted: must be a whole number/],
    [['--runs', 'many'], 2, /--runs must be a number \(got "many"\)/],
  ] as const)('%j is refused (exit %i)', (args, exit, msg) => {
    const r = run('cases/fuel-release-farm-well.json', ...args);
    expect(r.code).toBe(exit);
    expect(r.err).toMatch(msg);
  });

  test('a case without distributions is refused with a message saying what to do', () => {
    const r = run('cases/solvent-release-creek.json', '--runs', '100');
    expect(r.code).toBe(5);
    expect(r.err).toMatch(/no input has a distribution/);
  });
});

describe('npm run screen -- case.json with monitoring data', () => {
  // The figures must be the in-process analysis (src/case/observations.ts, itself tested against
  // SciPy and the steady-state centreline); here the CLI's job is to carry them in every format.
  const file = demo('depot-benzene-monitoring');
  const inProcess = async () => {
    const { analyseObservations } = await import('../../src/case/observations');
    const r = parseCaseFile(readFileSync(file, 'utf8'));
    if (!r.ok) throw new Error(r.errors.join('; '));
    return analyseObservations(r.case);
  };

  test('json: observations { wells: [{ name, trend: { s, tau, p, senSlope, verdict }, pointRate }], bulkRate, biodegradationRate }, rates per day', async () => {
    const { code, out } = run(file, '--format', 'json');
    expect(code).toBe(0);
    const o = JSON.parse(out).observations;
    const ref = await inProcess();
    expect(o.wells.map((w: { name: string }) => w.name)).toEqual(ref.wells.map((w) => w.name));
    o.wells.forEach((w: { trend: Record<string, unknown>; pointRate: { rate: number } | null }, i: number) => {
      const t = ref.wells[i].trend;
      expect(w.trend).toMatchObject({ s: t.mannKendall!.s, tau: t.mannKendall!.tau, p: t.mannKendall!.p, senSlope: t.sen!.slope, verdict: t.verdict });
      expect(w.pointRate?.rate ?? null).toBe(ref.wells[i].pointRate?.rate ?? null);
    });
    expect(o.bulkRate.rate).toBe(ref.bulkRate!.rate);
    expect(o.biodegradationRate.rate).toBe(ref.biodegradationRate!.rate);
    expect(o.biodegradationRate.interval).toEqual([...ref.biodegradationRate!.interval!]);
    expect(o.notes.join(' ')).toMatch(/must not be used as one in the transport solutions/);
  });

  test('table: a monitoring section with a row per well, the rates, the model comparison and the cautions', () => {
    const { code, out } = run(file);
    expect(code).toBe(0);
    const section = out.slice(out.indexOf('Monitoring data'), out.indexOf('\nWarnings'));
    for (const w of ['MW-1', 'MW-2', 'MW-3', 'MW-4', 'MW-5']) expect(section).toMatch(new RegExp(`\\n  ${w} `));
    expect(section).toMatch(/< 1 µg\/L/); // a non-detect printed as such
    expect(section).toMatch(/Bulk attenuation rate/);
    expect(section).toMatch(/Biodegradation rate \(Buscheck & Alcantar 1995/);
    const flat = section.replace(/\s+/g, ' '); // sentences are wrapped at 96 columns
    expect(flat).toMatch(/within a factor of ten/);
    expect(flat).toMatch(/must not be used as one in the transport solutions/);
  });

  test('csv: observation records before the caution, each the header\'s width', () => {
    const { code, out } = run(file, '--format', 'csv');
    expect(code).toBe(0);
    const rows = out.split('\r\n').filter(Boolean);
    const obs = rows.filter((r) => r.startsWith('observations,'));
    expect(obs).toHaveLength(6); // header + 5 wells
    expect(rows.some((r) => r.startsWith('biodegradation rate,'))).toBe(true);
    expect(rows[rows.length - 1].startsWith('screening caution,')).toBe(true);
  });

  test('a case without monitoring results has no observations key', () => {
    const { out } = run(demo('fuel-release-farm-well'), '--format', 'json');
    expect('observations' in JSON.parse(out)).toBe(false);
  });
});

describe('npm run screen -- case.json --observations results.csv --fit … --variant out.json', () => {
  const file = demo('depot-benzene-monitoring');
  test('imports the lab table (day-first dates asked for), fits, and writes a what-if variant; the case file is unchanged', () => {
    const before = readFileSync(file, 'utf8');
    const ambiguous = run(file, '--observations', 'cases/depot-benzene-2024.csv');
    expect(ambiguous.code).toBe(4);
    expect(ambiguous.err).toMatch(/could be day\/month or month\/day/);
    const out = join(dir, 'variant.json');
    const r = run(file, '--observations', 'cases/depot-benzene-2024.csv', '--date-order', 'dmy', '--fit', 'sourceConcentration,halfLife', '--variant', out, '--format', 'json');
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/imported 20 results/);
    const fit = JSON.parse(r.out).observations.fit;
    expect(fit.values.map((v: { parameter: string }) => v.parameter)).toEqual(['sourceConcentration', 'halfLife']);
    // the invented data were generated with a half-life of 0.5 yr (scripts/demo/make-depot-monitoring.py)
    const hl = fit.values[1];
    expect(hl.interval[0]).toBeLessThan(0.5 * 365.25 * 1.15);
    expect(hl.interval[1]).toBeGreaterThan(0.5 * 365.25 * 0.85);
    const v = parseCaseFile(readFileSync(out, 'utf8'));
    expect(v.ok).toBe(true);
    if (v.ok) {
      expect(v.case.parentId).toBe('demo-depot-benzene-monitoring');
      expect(v.case.monitoring.results).toHaveLength(120);
    }
    expect(readFileSync(file, 'utf8')).toBe(before);
  });

  test('bad monitoring options exit 2 with the reason', () => {
    expect(run(file, '--fit', 'porosity').err).toMatch(/--fit takes a comma-separated list/);
    expect(run(file, '--variant', 'x.json').err).toMatch(/needs --fit/);
    expect(run(file, '--date-order', 'ymd').code).toBe(2);
  });
});
