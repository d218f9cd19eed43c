/**
 * When two cases are "the same" for the library: same inputs, whatever their id and time stamps
 * (a demo opened twice, a file imported again). And a name not yet taken, for keeping both.
 */
import type { Case } from './schema';

/** JSON with object keys sorted, so key order (zod, hand-edited files) does not matter. */
function canonical(v: unknown): string {
  return JSON.stringify(v, (_k, x: unknown) =>
    x && typeof x === 'object' && !Array.isArray(x) ? Object.fromEntries(Object.entries(x as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) : x,
  );
}

/** Same content: every field but the id, the creation and modification stamps. */
export function sameContent(a: Case, b: Case): boolean {
  const strip = (c: Case) => ({ ...c, id: '', created: '', modified: '' });
  return canonical(strip(a)) === canonical(strip(b));
}

/** `name`, or `name (2)`, `name (3)`, … : the first not in `taken` (compared trimmed, case-insensitive). */
export function distinctName(name: string, taken: readonly string[]): string {
  const used = new Set(taken.map((t) => t.trim().toLowerCase()));
  const base = name.trim().replace(/ \(\d+\)$/, '');
  if (!used.has(name.trim().toLowerCase())) return name.trim();
  for (let k = 2; ; k++) {
    const n = `${base.slice(0, 190)} (${k})`;
    if (!used.has(n.toLowerCase())) return n;
  }
}
