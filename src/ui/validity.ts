/**
 * Which input the engine rejected, for the inline messages. Set by the evaluation loop from the
 * ValidationError of case preparation (its `field` is the case field path).
 */
import { signal } from '@preact/signals';
import { currentResults } from './state';

export interface InputIssue {
  field: string;
  message: string;
}

export const inputIssue = signal<InputIssue | null>(null);

/** The engine's message for this field (or a field inside it), or null. Reading subscribes. */
export function fieldIssue(field: string): string | null {
  const i = inputIssue.value;
  if (!i) return null;
  return matches(i.field, field) ? i.message : null;
}

function matches(path: string | undefined, field: string): boolean {
  return !!path && (path === field || path.startsWith(field + '.') || path.startsWith(field + '['));
}

/** Doubtful-input warnings of the latest results for this field (shown at the field as well as
 * with the results). Reading subscribes. */
export function fieldWarnings(field: string): string[] {
  const r = currentResults.value;
  if (!r) return [];
  return r.warnings.filter((w) => matches(w.field, field)).map((w) => w.message);
}
