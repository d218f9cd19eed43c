/**
 * Reading a stored case: whatever version the record holds is brought to the current case
 * version and validated. A record that fails is reported, never dropped.
 */
import { caseSchema, type Case } from '../case/schema';

export type ReadResult = { ok: true; case: Case } | { ok: false; error: string };

export function readCaseData(data: unknown): ReadResult {
  const parsed = caseSchema.safeParse(data);
  if (parsed.success) return { ok: true, case: parsed.data };
  const first = parsed.error.issues.slice(0, 3).map((i) => `${i.path.join('.') || '(case)'}: ${i.message}`);
  return { ok: false, error: `stored case does not validate — ${first.join('; ')}` };
}
