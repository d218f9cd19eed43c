/**
 * Which input the engine rejected, for the inline messages. Set by the evaluation loop from the
 * ValidationError of case preparation (its `field` is the case field path).
 */
import { signal } from '@preact/signals';

export interface InputIssue {
  field: string;
  message: string;
}

export const inputIssue = signal<InputIssue | null>(null);

/** The engine's message for this field (or a field inside it), or null. Reading subscribes. */
export function fieldIssue(field: string): string | null {
  const i = inputIssue.value;
  if (!i) return null;
  return i.field === field || i.field.startsWith(field + '.') || i.field.startsWith(field + '[') ? i.message : null;
}
