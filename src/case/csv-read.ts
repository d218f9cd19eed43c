/**
 * Reading a delimited text table (RFC 4180): fields separated by one delimiter, records ended by
 * CRLF, LF or CR, a field in double quotes may hold the delimiter, line breaks and doubled quotes.
 * Each record keeps the line number it starts on, so problems can be reported by line. A quote
 * that is never closed is an error naming the line where its field began. A byte-order mark is
 * skipped; blank lines are dropped.
 */
export interface CsvRecord {
  /** 1-based line number where the record starts */
  readonly line: number;
  readonly fields: string[];
}

export class CsvError extends Error {
  readonly line: number;
  constructor(line: number, message: string) {
    super(`line ${line}: ${message}`);
    this.name = 'CsvError';
    this.line = line;
  }
}

export const DELIMITERS = [',', ';', '\t', '|'] as const;
export type Delimiter = (typeof DELIMITERS)[number];

export function delimiterName(d: string): string {
  return d === '\t' ? 'tab' : d === ',' ? 'comma' : d === ';' ? 'semicolon' : d === '|' ? 'vertical bar' : JSON.stringify(d);
}

/** Counts each candidate delimiter outside quotes on the first non-blank line. */
export function delimiterCounts(text: string): Record<Delimiter, number> {
  const counts: Record<Delimiter, number> = { ',': 0, ';': 0, '\t': 0, '|': 0 };
  let inQuotes = false;
  let seen = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (ch === '"') inQuotes = !inQuotes;
    else if (!inQuotes && (ch === '\n' || ch === '\r')) {
      if (seen) break;
    } else if (!inQuotes && ch in counts) {
      counts[ch as Delimiter]++;
      seen = true;
    } else if (ch.trim()) seen = true;
  }
  return counts;
}

/** The most frequent candidate on the header line, or null when the line has none of them. */
export function detectDelimiter(text: string): Delimiter | null {
  const c = delimiterCounts(text);
  let best: Delimiter | null = null;
  for (const d of DELIMITERS) if (c[d] > 0 && (best === null || c[d] > c[best])) best = d;
  return best;
}

export function readCsv(text: string, delimiter: string): CsvRecord[] {
  const records: CsvRecord[] = [];
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = 1;
  let fields: string[] = [];
  let field = '';
  let recordLine = 1;
  let quoteLine = 0;
  let inQuotes = false;
  let fieldStarted = false;
  const endRecord = () => {
    fields.push(field);
    if (!(fields.length === 1 && fields[0].trim() === '')) records.push({ line: recordLine, fields });
    fields = [];
    field = '';
    fieldStarted = false;
  };
  for (; i < text.length; i++) {
    const ch = text[i];
    if (inQuotes) {
      if (ch === '"') {
        if (text[i + 1] === '"') {
          field += '"';
          i++;
        } else inQuotes = false;
      } else {
        if (ch === '\n' || (ch === '\r' && text[i + 1] !== '\n')) line++;
        field += ch;
      }
      continue;
    }
    if (ch === '"' && !fieldStarted && field.trim() === '') {
      field = '';
      inQuotes = true;
      fieldStarted = true;
      quoteLine = line;
    } else if (ch === delimiter) {
      fields.push(field);
      field = '';
      fieldStarted = false;
    } else if (ch === '\r' || ch === '\n') {
      if (ch === '\r' && text[i + 1] === '\n') i++;
      endRecord();
      line++;
      recordLine = line;
    } else {
      field += ch;
      if (ch.trim()) fieldStarted = true;
    }
  }
  if (inQuotes) throw new CsvError(quoteLine, 'a quoted field is never closed (a " without its partner)');
  if (field !== '' || fields.length > 0) endRecord();
  return records;
}
