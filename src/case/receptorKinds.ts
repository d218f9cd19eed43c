/** The kinds of receptor in the screen's words: the panel, the report and exports say these, never the codes. */
import type { ReceptorKind } from './schema';

export const KIND_LABEL: Readonly<Record<ReceptorKind, string>> = Object.freeze({
  well: 'Well',
  spring: 'Spring',
  'surface-water': 'Creek, pond or river',
  'property-line': 'Property line',
  other: 'Other point',
});

/** A kind in words (lower case, for the middle of a sentence); an unknown kind as it is. */
export function kindText(kind: string): string {
  return (KIND_LABEL as Record<string, string>)[kind]?.toLowerCase() ?? kind;
}
