/**
 * Reading a stored case: whatever case-file version the record holds is migrated to the current
 * version and validated by the case engineer's `migrateCase`. A record that fails is reported,
 * never dropped.
 */
import type { Case } from '../case/schema';
import { CaseFormatError, migrateCase } from '../case/migrate';

export type ReadResult = { ok: true; case: Case } | { ok: false; error: string };

export function readCaseData(data: unknown): ReadResult {
  try {
    return { ok: true, case: migrateCase(data) };
  } catch (e) {
    const detail = e instanceof CaseFormatError ? e.errors.slice(0, 3).join('; ') : e instanceof Error ? e.message : String(e);
    return { ok: false, error: `the stored case cannot be opened — ${detail}` };
  }
}
