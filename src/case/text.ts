/**
 * The one rule for reading a file's bytes as text, shared by the app's file import and the command
 * line (case files and monitoring CSV files):
 *   - UTF-8, with or without a byte-order mark (EF BB BF), is read; the mark is dropped;
 *   - UTF-16 with a byte-order mark (FF FE little-endian, FE FF big-endian) is read;
 *   - anything else is refused with a message: bytes that are not well-formed UTF-8 (Windows-1252
 *     or Latin-1 text, overlong forms, encoded surrogates; The Unicode Standard, ch. 3, Table 3-7
 *     "Well-Formed UTF-8 Byte Sequences"), UTF-32, UTF-16 without a mark, a second mark, NUL
 *     characters (binary data) and unpaired UTF-16 surrogates.
 * Nothing is ever replaced by U+FFFD: text that cannot be read exactly is not read. Decoding is done
 * here by hand (no TextDecoder), so the app and Node read every byte the same way.
 */

export type DecodedText = { ok: true; text: string; encoding: 'UTF-8' | 'UTF-16LE' | 'UTF-16BE' } | { ok: false; error: string };

const SAVE_AS = 'save it as UTF-8 (the usual choice for text files) and try again';

function refuse(error: string): DecodedText {
  return { ok: false, error };
}

/** Strict UTF-8 → string, or the byte offset of the first ill-formed sequence. */
function utf8(bytes: Uint8Array, start: number): string | number {
  const units: number[] = [];
  let out = '';
  for (let i = start; i < bytes.length; ) {
    const b = bytes[i];
    let cp: number;
    let n: number;
    if (b < 0x80) {
      cp = b;
      n = 1;
    } else if (b >= 0xc2 && b <= 0xdf) {
      n = 2;
      cp = b & 0x1f;
    } else if (b >= 0xe0 && b <= 0xef) {
      n = 3;
      cp = b & 0x0f;
    } else if (b >= 0xf0 && b <= 0xf4) {
      n = 4;
      cp = b & 0x07;
    } else return i; // 80–C1 (continuation or overlong lead), F5–FF
    if (i + n > bytes.length) return i;
    for (let k = 1; k < n; k++) {
      const c = bytes[i + k];
      if ((c & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (c & 0x3f);
    }
    // overlong forms, UTF-16 surrogates and values above U+10FFFF are not well-formed
    if ((n === 3 && (cp < 0x800 || (cp >= 0xd800 && cp <= 0xdfff))) || (n === 4 && (cp < 0x10000 || cp > 0x10ffff))) return i;
    if (cp > 0xffff) {
      const v = cp - 0x10000;
      units.push(0xd800 + (v >> 10), 0xdc00 + (v & 0x3ff));
    } else units.push(cp);
    i += n;
    if (units.length >= 8192) {
      out += String.fromCharCode(...units);
      units.length = 0;
    }
  }
  return out + String.fromCharCode(...units);
}

/** UTF-16 → string, or the byte offset of an unpaired surrogate or odd trailing byte. */
function utf16(bytes: Uint8Array, start: number, littleEndian: boolean): string | number {
  if ((bytes.length - start) % 2) return bytes.length - 1;
  const units: number[] = [];
  let out = '';
  for (let i = start; i < bytes.length; i += 2) {
    const u = littleEndian ? bytes[i] | (bytes[i + 1] << 8) : (bytes[i] << 8) | bytes[i + 1];
    if (u >= 0xd800 && u <= 0xdbff) {
      const j = i + 2;
      const next = j + 1 < bytes.length ? (littleEndian ? bytes[j] | (bytes[j + 1] << 8) : (bytes[j] << 8) | bytes[j + 1]) : -1;
      if (!(next >= 0xdc00 && next <= 0xdfff)) return i;
    } else if (u >= 0xdc00 && u <= 0xdfff) {
      const prev = units.length ? units[units.length - 1] : out.charCodeAt(out.length - 1);
      if (!(prev >= 0xd800 && prev <= 0xdbff)) return i;
    }
    units.push(u);
    if (units.length >= 8192) {
      out += String.fromCharCode(...units);
      units.length = 0;
    }
  }
  return out + String.fromCharCode(...units);
}

/** A file's bytes as text by the rule above. */
export function decodeText(bytes: Uint8Array): DecodedText {
  const b = bytes;
  let text: string | number;
  let encoding: 'UTF-8' | 'UTF-16LE' | 'UTF-16BE';
  if (b.length >= 4 && ((b[0] === 0xff && b[1] === 0xfe && b[2] === 0 && b[3] === 0) || (b[0] === 0 && b[1] === 0 && b[2] === 0xfe && b[3] === 0xff)))
    return refuse(`the file is UTF-32 text, which is not read; ${SAVE_AS}`);
  if (b.length >= 3 && b[0] === 0xef && b[1] === 0xbb && b[2] === 0xbf) {
    encoding = 'UTF-8';
    text = utf8(b, 3);
  } else if (b.length >= 2 && b[0] === 0xff && b[1] === 0xfe) {
    encoding = 'UTF-16LE';
    text = utf16(b, 2, true);
  } else if (b.length >= 2 && b[0] === 0xfe && b[1] === 0xff) {
    encoding = 'UTF-16BE';
    text = utf16(b, 2, false);
  } else {
    // NUL bytes with no mark: UTF-16 without its mark (every other byte NUL in ASCII text), or binary data
    const head = b.subarray(0, 4096);
    const nuls = head.reduce((n, x) => n + (x === 0 ? 1 : 0), 0);
    if (nuls > 0) {
      const oddOrEven = (k: number) => head.filter((x, i) => i % 2 === k && x === 0).length;
      const utf16Like = head.length >= 4 && Math.max(oddOrEven(0), oddOrEven(1)) >= 0.4 * head.length && Math.min(oddOrEven(0), oddOrEven(1)) === 0;
      return refuse(
        utf16Like
          ? `the file looks like UTF-16 text without a byte-order mark, which cannot be told apart from other encodings; ${SAVE_AS}`
          : 'this is not a text file (it holds binary data, such as an image, archive or document)',
      );
    }
    encoding = 'UTF-8';
    text = utf8(b, 0);
  }
  if (typeof text === 'number') {
    if (encoding !== 'UTF-8') return refuse(`the file is not readable ${encoding} text (at byte ${text + 1} a character is cut in half); ${SAVE_AS}`);
    return refuse(
      `the file is not UTF-8 text (byte ${text + 1} cannot be read as UTF-8; it may be in a Windows or Latin-1 encoding); ${SAVE_AS}`,
    );
  }
  if (text.charCodeAt(0) === 0xfeff) return refuse(`the file begins with two byte-order marks; ${SAVE_AS}`);
  if (text.includes('\u0000')) return refuse('this is not a text file (it holds binary data, such as an image, archive or document)');
  return { ok: true, text, encoding };
}
