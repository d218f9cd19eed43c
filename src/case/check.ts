/**
 * The complete checks a case passes before it is screened, in one place: its shape (the schema,
 * applied by `migrateCase` when a file or a stored record is read) and its physical sense
 * (`prepareCase`, the same preparation the screen, the workers and the command line run).
 *
 * `placementProblem` is the part the map needs before it can draw anything at all: the site datum
 * and every position (release, outline, receptors, water-level wells, monitoring wells) placed in the site's frame.
 * A case that fails it can still be stored and repaired, but no map can be framed on it, so the
 * start-up does not open it unasked and the map shows the problem instead of drawing.
 */
import type { Case, Position } from './schema';
import { ValidationError } from '../core/validation';
import { prepareCase } from './prepare';
import { makeLocalFrame } from '../geo/projection';
import { positionRange, prepareFrame } from './geometry';
import { inCaseWords } from './checked';

/** The reason a geo step gave, as plain words. */
function reason(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

/** Every position of the case with its case field path, in the order the panel lists them. */
export function casePositions(c: Case): [string, Position][] {
  const site = c.site;
  const out: [string, Position][] = [['site.source.position', site.source.position]];
  site.source.footprint?.forEach((p, i) => out.push([`site.source.footprint[${i}]`, p]));
  site.receptors.forEach((r, i) => out.push([`site.receptors[${i}].position`, r.position]));
  if (site.flow.method === 'heads') site.flow.readings.forEach((r, i) => out.push([`site.flow.readings[${i}].position`, r.position]));
  c.monitoring.wells.forEach((w, i) => w.position && out.push([`monitoring.wells[${i}].position`, w.position]));
  return out;
}

/** Why a position typed for a point cannot be placed in the case's frame (with the accepted range), or null. */
export function positionProblem(c: Case, p: Position): string | null {
  try {
    makeLocalFrame(c.site.frame, c.site.datum).toEN(p);
    return null;
  } catch (e) {
    return `${reason(e)}; accepted: ${positionRange(c.site.frame)}`;
  }
}

/** The first position (or the datum) that cannot be placed on the site's map, or null. */
export function placementProblem(c: Case): ValidationError | null {
  try {
    const sf = prepareFrame(c);
    for (const [field, p] of casePositions(c)) sf.toEN(field, p);
    return null;
  } catch (e) {
    const named = inCaseWords(e, c);
    return named instanceof ValidationError ? named : new ValidationError('site.datum', c.site.datum, 'a site the map can place', reason(e));
  }
}

/** The first problem that stops the case being screened (placement first), or null. */
export function caseProblem(c: Case): ValidationError | null {
  const placed = placementProblem(c);
  if (placed) return placed;
  try {
    prepareCase(c);
    return null;
  } catch (e) {
    if (e instanceof ValidationError) return e;
    return new ValidationError('(the case)', undefined, 'a case the engine can prepare', reason(e));
  }
}
