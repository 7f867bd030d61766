/** Sentences the live region reads after an edit: what happened, and what the rules now say there. */
import type { Finding, Place } from '~/lib/domain/schemas';
import { placeKey } from '~/lib/domain/places';
import { severityWords } from '~/lib/domain/vocabulary';
import { countOf } from '~/lib/domain/words';

export function findingsHereWords(findings: readonly Finding[], place: Place): string {
  const key = placeKey(place);
  const here = findings.filter((f) => f.places.some((p) => placeKey(p) === key));
  const all = findings.length;
  const total = all === 0 ? 'No findings in the layout.' : `${countOf(all, 'finding')} in the layout.`;
  if (here.length === 0) return `No findings here. ${total}`;
  return `${here.map((f) => `${severityWords(f.severity)}: ${f.title}.`).join(' ')} ${total}`;
}
