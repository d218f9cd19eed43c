/**
 * Writing CSV records (RFC 4180), the one rule of every CSV the program writes: records end in
 * CRLF; a field holding a comma, a double quote, CR or LF is quoted and its quotes doubled. A text
 * cell that starts with = + - @ or a tab/CR is prefixed with an apostrophe, so that a spreadsheet
 * does not run it as a formula (OWASP "CSV injection" guidance); numeric cells are never altered.
 * `withCaution` closes a file with the screening caution as a final two-field record padded to the
 * column count, so it travels with the numbers.
 */
export type Cell = string | number | null;

function textCell(s: string): string {
  return /^[=+\-@\t\r]/.test(s) ? `'${s}` : s;
}

export function csvField(v: Cell): string {
  let s: string;
  if (v === null) s = '';
  else if (typeof v === 'number') s = Number.isFinite(v) ? String(v) : '';
  else s = textCell(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvRecords(rows: readonly (readonly Cell[])[]): string {
  return rows.map((r) => r.map(csvField).join(',')).join('\r\n') + '\r\n';
}

export function withCaution(header: Cell[], rows: Cell[][], caution: string): string {
  const pad = (r: Cell[]) => [...r, ...Array(Math.max(0, header.length - r.length)).fill('')];
  return csvRecords([header, ...rows, pad(['screening caution', caution])]);
}
