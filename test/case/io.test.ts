/**
 * Case files in and out: each bad file gets its plain-words message and nothing throws; export
 * then import gives back an identical case and identical text. Byte counts are checked against
 * Node's Buffer.byteLength (UTF-8, RFC 3629) as the reference.
 */
import { describe, expect, test } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { parseCaseFile, serializeCase, utf8Length, MAX_DEPTH } from '../../src/case/io';
import { newCase } from '../../src/case/defaults';

const good = () => newCase({ name: 'io test', now: new Date('2026-01-02T03:04:05Z') });
const text = (o: unknown) => JSON.stringify(o);

describe('rejection table: each bad file → its message, nothing thrown', () => {
  const c = good();
  const rows: [string, string, RegExp, { maxBytes?: number }?][] = [
    ['oversized', serializeCase(c), /larger than the 1\.0 kB accepted/, { maxBytes: 1024 }],
    ['empty', '   \n', /the file is empty/],
    // issue 13 item 6: the screen's words, not the parser's (whose wording differs between engines)
    ['not JSON', '{ "format": "downgradient-case", version: 2 }', /^the case file is damaged at line 1, column 34 \(near “version: 2 }”\)/],
    ['truncated JSON', serializeCase(c).slice(0, 200), /^the case file is cut short or damaged: its text ends before the case is complete/],
    ['another kind of file', '<html><body>a page</body></html>', /^this is not a case file: a case file is JSON text that begins with “\{”, and this file begins with “<html><body>a page<\/body”/],
    ['a JSON list', '[1,2,3]', /one JSON object/],
    ['a JSON string', '"case"', /one JSON object/],
    ['wrong format', text({ ...c, format: 'gpx' }), /"gpx" is not accepted.*not a Downgradient case file/],
    ['unknown version', text({ ...c, version: 99 }), /version 99 is newer than this copy/],
    ['__proto__ key', '{"format":"downgradient-case","version":2,"__proto__":{"polluted":true}}', /__proto__: the key "__proto__" is not accepted/],
    ['nested constructor key', text({ ...c, site: { ...c.site, constructor: { prototype: {} } } }), /site\.constructor: the key "constructor" is not accepted/],
    ['prototype key in a list', text({ ...c, site: { ...c.site, receptors: [{ prototype: 1 }] } }), /site\.receptors\[0\]\.prototype/],
    ['absurd nesting', '{"a":' + '['.repeat(100_000) + ']'.repeat(100_000) + '}', new RegExp(`more than ${MAX_DEPTH} levels deep`)],
    ['overlong string', text({ ...c, notes: 'x'.repeat(150_000) }), /text value of 150000 characters is longer than the 100000 accepted/],
    ['schema: notes over 20 000 characters', text({ ...c, notes: 'x'.repeat(20_001) }), /^notes: .* is too large; accepted: at most 20000 characters/],
    ['a number too large for a double (1e400 → Infinity)', serializeCase(c).replace('"effectivePorosity": 0.25', '"effectivePorosity": 1e400'), /^Effective porosity nₑ \(aquifer\.effectivePorosity\): expected a finite number, got Infinity/],
    ['schema: name too long', text({ ...c, name: 'n'.repeat(300) }), /^name: .* is too large; accepted: at most 200 characters/],
    ['schema: porosity as text', text({ ...c, aquifer: { ...c.aquifer, effectivePorosity: '0.3' } }), /^Effective porosity nₑ \(aquifer\.effectivePorosity\): expected a number, got "0\.3"/],
    ['schema: wrong unit dimension', text({ ...c, aquifer: { ...c.aquifer, hydraulicConductivity: { value: 1, unit: 'mg/L' } } }), /^Unit of hydraulic conductivity K \(aquifer\.hydraulicConductivity\.unit\): "mg\/L" must be a conductivity unit \(K:m\/d, K:m\/s/],
    ['schema: unknown flow method', text({ ...c, site: { ...c.site, flow: { method: 'guess' } } }), /^Flow from \(site\.flow\.method\): "guess" is not accepted; accepted values: "direction", "heads"/],
    ['schema: receptor kind', text({ ...c, site: { ...c.site, receptors: [{ id: 'r', name: 'r', kind: 'lake', position: [1, 2], screenTop: { value: 0, unit: 'm' }, screenBottom: { value: 0, unit: 'm' } }] } }), /^Kind of receptor 1 \(site\.receptors\[0\]\.kind\): "lake" is not accepted; accepted values: "well", "spring"/],
    ['schema: missing section', text({ ...c, evaluation: undefined }), /^evaluation is missing: expected an object/],
    ['schema: solution', text({ ...c, evaluation: { ...c.evaluation, solution: 'numerical' } }), /Solution \(evaluation\.solution\): "numerical" is not accepted; accepted values: "domenico", "exact"/],
    ['schema: too many receptors', text({ ...c, site: { ...c.site, receptors: Array(201).fill(null) } }), /Receptors \(site\.receptors\): a list is too large; accepted: at most 200 items/],
  ];
  test.each(rows)('%s', (_label, body, message, opts) => {
    let r: ReturnType<typeof parseCaseFile> | undefined;
    expect(() => (r = parseCaseFile(body, opts))).not.toThrow();
    expect(r!.ok).toBe(false);
    if (!r!.ok) expect(r!.errors.join('\n')).toMatch(message);
  });

  test('no prototype is polluted by a hostile file', () => {
    parseCaseFile('{"__proto__":{"polluted":"yes"},"constructor":{"prototype":{"polluted":"yes"}}}');
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  test('a byte-order mark is tolerated', () => {
    const r = parseCaseFile('\uFEFF' + serializeCase(good()));
    expect(r.ok).toBe(true);
  });

  test('every problem is listed, not only the first', () => {
    const r = parseCaseFile(text({ ...c, name: '', aquifer: { ...c.aquifer, totalPorosity: null, fractionOrganicCarbon: 'a' } }));
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors.some((e) => e.startsWith('name:'))).toBe(true);
      expect(r.errors.some((e) => e.includes('(aquifer.totalPorosity):'))).toBe(true);
      expect(r.errors.some((e) => e.includes('(aquifer.fractionOrganicCarbon):'))).toBe(true);
    }
  });
});

describe('round trip', () => {
  const demo = readdirSync('cases').filter((f) => f.endsWith('.json'));
  const cases = [['newCase()', good()] as const, ...demo.map((f) => {
    const r = parseCaseFile(readFileSync(`cases/${f}`, 'utf8'));
    if (!r.ok) throw new Error(`${f}: ${r.errors.join('; ')}`);
    return [f, r.case] as const;
  })];

  test.each(cases)('%s: export → import is identical, and so is the text', (_name, c) => {
    const out = serializeCase(c);
    const back = parseCaseFile(out);
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    expect(back.case).toEqual(c);
    expect(serializeCase(back.case)).toBe(out);
  });

  test('key order is the schema order whatever the input order', () => {
    const c = good();
    const reversed = JSON.parse(JSON.stringify(c, (_k, v) => (v && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).reverse()) : v)));
    expect(Object.keys(reversed)[0]).toBe('monitoring');
    expect(serializeCase(reversed)).toBe(serializeCase(c));
    expect(serializeCase(c).startsWith('{\n  "format": "downgradient-case",\n  "version": 3,\n')).toBe(true);
  });

  test('an invalid case is still written out, as it is (nothing lost)', () => {
    const c = { ...good(), aquifer: { ...good().aquifer, effectivePorosity: 'draft' } } as never;
    expect(JSON.parse(serializeCase(c)).aquifer.effectivePorosity).toBe('draft');
  });
});

test('utf8Length agrees with Buffer.byteLength (1-, 2-, 3- and 4-byte characters)', () => {
  for (const s of ['', 'abc', 'µg/L', 'αL — ≥ 0', 'a\u{1F4A7}b', '\uD800', 'x'.repeat(1000) + 'ü']) {
    expect(utf8Length(s)).toBe(Buffer.byteLength(s, 'utf8'));
  }
});
