/**
 * Plain-text formatting of the benchmark figures. Pure.
 */

/** 12 345 678 → "12.3 M"; 4 321 → "4.32 k" */
export function si(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  const a = Math.abs(value);
  if (a >= 1e9) return `${(value / 1e9).toPrecision(3)} G`;
  if (a >= 1e6) return `${(value / 1e6).toPrecision(3)} M`;
  if (a >= 1e3) return `${(value / 1e3).toPrecision(3)} k`;
  return `${value.toPrecision(3)} `;
}

export function seconds(s: number): string {
  if (s >= 1) return `${s.toPrecision(3)} s`;
  if (s >= 1e-3) return `${(s * 1e3).toPrecision(3)} ms`;
  return `${(s * 1e6).toPrecision(3)} µs`;
}

export function ratio(r: number): string {
  return Number.isFinite(r) ? `${r.toPrecision(3)}×` : '—';
}

export function sci(x: number | null | undefined): string {
  return x === null || x === undefined || !Number.isFinite(x) ? '—' : x.toExponential(1);
}

/** A table with a header row; columns padded to their widest cell, numbers right-aligned. */
export function table(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((r) => (r[c] ?? '').length)));
  const line = (cells: readonly string[]) =>
    cells.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]) : cell.padStart(widths[c]))).join('  ');
  return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

export interface Target {
  readonly name: string;
  readonly wanted: string;
  readonly measured: string;
  readonly met: boolean | null;
}

export function targetTable(targets: readonly Target[]): string {
  return table(
    ['target', 'wanted', 'measured', 'met'],
    targets.map((t) => [t.name, t.wanted, t.measured, t.met === null ? 'not measured' : t.met ? 'yes' : 'NO']),
  );
}
