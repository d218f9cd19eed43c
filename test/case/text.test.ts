/**
 * The one text-reading rule (src/case/text.ts), on byte fixtures. References: The Unicode
 * Standard, ch. 3, Table 3-7 (well-formed UTF-8 byte sequences) for the ill-formed cases
 * (overlong forms C0 AF and E0 80 AF, an encoded surrogate ED A0 80, F5 and above); the byte-order
 * marks of UTF-8 (EF BB BF), UTF-16LE (FF FE) and UTF-16BE (FE FF) from the same standard, ch. 2.
 * As an independent decoder, the WHATWG Encoding Standard's UTF-8 decoder with fatal errors (Node's
 * TextDecoder) must accept exactly the byte strings accepted here and give the same text.
 */
import { describe, expect, test } from 'vitest';
import { readFileSync } from 'node:fs';
import { decodeText } from '../../src/case/text';
import { parseCaseFile } from '../../src/case/io';

const bytes = (...xs: number[]) => new Uint8Array(xs);
const ascii = (s: string) => [...s].map((ch) => ch.charCodeAt(0));
const le16 = (s: string) => [...s].flatMap((ch) => [ch.charCodeAt(0) & 0xff, ch.charCodeAt(0) >> 8]);
const be16 = (s: string) => [...s].flatMap((ch) => [ch.charCodeAt(0) >> 8, ch.charCodeAt(0) & 0xff]);
const json = '{"a":"µg/L"}';
const utf8Json = [...new TextEncoder().encode(json)];

describe('read: UTF-8 with or without its mark, UTF-16 with its mark', () => {
  test.each([
    ['UTF-8', utf8Json, 'UTF-8'],
    ['UTF-8 with a mark', [0xef, 0xbb, 0xbf, ...utf8Json], 'UTF-8'],
    ['UTF-16LE with a mark', [0xff, 0xfe, ...le16(json)], 'UTF-16LE'],
    ['UTF-16BE with a mark', [0xfe, 0xff, ...be16(json)], 'UTF-16BE'],
    // U+1F600 as a surrogate pair in UTF-16LE, and as 4 bytes in UTF-8
    ['UTF-16LE pair', [0xff, 0xfe, 0x3d, 0xd8, 0x00, 0xde], 'UTF-16LE'],
    ['UTF-8 4-byte', [0xf0, 0x9f, 0x98, 0x80], 'UTF-8'],
  ] as const)('%s', (_name, b, encoding) => {
    const r = decodeText(bytes(...b));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.encoding).toBe(encoding);
    expect(r.text).toBe(_name.endsWith('pair') || _name.endsWith('4-byte') ? '\u{1F600}' : json);
  });
});

describe('refused, with a message', () => {
  test.each([
    ['Windows-1252 "µ" (B5)', bytes(...ascii('{"a":"'), 0xb5, ...ascii('g/L"}')), /not UTF-8 text \(byte 7 cannot be read as UTF-8; it may be in a Windows or Latin-1 encoding\)/],
    ['overlong "/" (C0 AF)', bytes(0xc0, 0xaf), /not UTF-8 text \(byte 1/],
    ['overlong 3-byte (E0 80 AF)', bytes(0x41, 0xe0, 0x80, 0xaf), /byte 2 cannot be read as UTF-8/],
    ['encoded surrogate (ED A0 80)', bytes(0xed, 0xa0, 0x80), /not UTF-8 text/],
    ['above U+10FFFF (F4 90 80 80)', bytes(0xf4, 0x90, 0x80, 0x80), /not UTF-8 text/],
    ['F5 lead byte', bytes(0xf5, 0x80, 0x80, 0x80), /not UTF-8 text/],
    ['cut-off sequence at the end', bytes(0x41, 0xe2, 0x82), /byte 2 cannot be read/],
    ['two UTF-8 marks', bytes(0xef, 0xbb, 0xbf, 0xef, 0xbb, 0xbf, ...ascii('{}')), /begins with two byte-order marks/],
    ['UTF-16LE without a mark', bytes(...le16('{"format": "x"}')), /UTF-16 text without a byte-order mark/],
    ['UTF-32LE', bytes(0xff, 0xfe, 0, 0, 0x7b, 0, 0, 0), /UTF-32/],
    ['UTF-16LE unpaired surrogate', bytes(0xff, 0xfe, 0x3d, 0xd8, 0x41, 0x00), /not readable UTF-16LE text \(at byte 3/],
    ['UTF-16BE odd length', bytes(0xfe, 0xff, 0x00, 0x41, 0x00), /not readable UTF-16BE text/],
    ['PNG header', bytes(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13), /not a text file/],
    ['NUL inside UTF-8 text', bytes(...ascii('{"a":'), 0, ...ascii('1}')), /not a text file/],
  ])('%s', (_name, b, message) => {
    const r = decodeText(b);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(message);
  });
});

test('UTF-8 without a mark agrees with the WHATWG fatal decoder on every 1- and 2-byte string and seeded longer ones', () => {
  const whatwg = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true });
  const check = (b: Uint8Array) => {
    if (b.includes(0) || (b[0] === 0xef && b[1] === 0xbb && b[2] === 0xbf) || (b[0] === 0xff && b[1] === 0xfe) || (b[0] === 0xfe && b[1] === 0xff)) return;
    let ref: string | null;
    try {
      ref = whatwg.decode(b);
    } catch {
      ref = null;
    }
    const r = decodeText(b);
    expect(r.ok ? r.text : null, `bytes ${[...b].map((x) => x.toString(16)).join(' ')}`).toBe(ref);
  };
  for (let a = 1; a < 256; a++) {
    check(bytes(a));
    for (let c = 1; c < 256; c++) check(bytes(a, c));
  }
  // 20 000 strings of 3–6 bytes biased to lead and continuation bytes (a seeded LCG)
  let s = 12345;
  const next = () => (s = (Math.imul(s, 1103515245) + 12345) >>> 0) >>> 16;
  const pool = [0x41, 0x80, 0x8f, 0x90, 0x9f, 0xa0, 0xbf, 0xc2, 0xdf, 0xe0, 0xe1, 0xed, 0xee, 0xef, 0xf0, 0xf1, 0xf4, 0xf5];
  for (let k = 0; k < 20000; k++) check(bytes(...Array.from({ length: 3 + (next() % 4) }, () => pool[next() % pool.length])));
});

test('a demo case file read in each accepted encoding gives the same case', () => {
  const text = readFileSync('cases/nitrate-field-supply.json', 'utf8');
  const variants = [
    [...new TextEncoder().encode(text)],
    [0xef, 0xbb, 0xbf, ...new TextEncoder().encode(text)],
    [0xff, 0xfe, ...le16(text)],
    [0xfe, 0xff, ...be16(text)],
  ];
  const cases = variants.map((b) => {
    const r = decodeText(bytes(...b));
    if (!r.ok) throw new Error(r.error);
    const p = parseCaseFile(r.text);
    if (!p.ok) throw new Error(p.errors.join('\n'));
    return p.case;
  });
  for (const c of cases.slice(1)) expect(c).toEqual(cases[0]);
});
