/**
 * Parts requests: no order for a layout that does not fit.
 *
 * A request made from a saved layout or a plan carries the layout its lines were worked out for.
 * If that layout has blocks-fit findings, the request is refused (409 naming the findings) unless
 * the caller may override (`parts.overrideFit`: technicians and dealer administrators) and gives
 * `overrideReason`; an operator who gives one is refused with a 403 naming that field. The reason,
 * who gave it, when, and the findings it covered are kept on the request.
 *
 * At submit the kept layout is checked again against today's rules and catalog: a blocks-fit
 * finding that the override did not cover (a rule or catalog changed meanwhile) refuses the send
 * with a 409 naming `fit` and the findings, and nothing is written or mailed.
 */
import type { PartsRequestFitFinding, PartsRequestFitOverride } from '~/db/schema';
import { checkLayout } from '~/lib/domain';
import type { CatalogIndex } from '~/lib/domain/catalog';
import type { CatalogPart, Finding, Layout, MachineFamily } from '~/lib/domain/schemas';
import { placeWords } from '~/lib/domain/vocabulary';
import { countOf } from '~/lib/domain/words';
import { can, rolesFor, type Actor } from '~/lib/server/access';
import { HttpError } from '~/lib/server/http';

/** The blocks-fit findings of a layout, as a request keeps and shows them. */
export function blockingFindings(
  family: MachineFamily,
  catalog: readonly CatalogPart[] | CatalogIndex,
  layout: Layout,
): PartsRequestFitFinding[] {
  return checkLayout(family, catalog, layout)
    .filter((f: Finding) => f.severity === 'blocks-fit')
    .map((f) => ({ code: f.code, title: f.title, places: f.places.map(placeWords) }));
}

const findingKey = (f: PartsRequestFitFinding) => `${f.code}|${f.places.join(';')}`;

/** One finding in words: "Two elements at position 3, right (LAYOUT_DUPLICATE_PLACE)". */
export const fitFindingWords = (f: PartsRequestFitFinding) =>
  `${f.title} (${f.code})${f.places.length ? ` at ${f.places.join(', ')}` : ''}`;

function refuse(findings: PartsRequestFitFinding[], message: string, field = 'overrideReason'): HttpError {
  return new HttpError(409, message, field, { findings });
}

/**
 * Judges a new request's layout: nothing to say (it fits), an override to keep, or a refusal.
 * A reason given for a layout that fits is not needed and not kept.
 */
export function judgeFit(
  actor: Actor,
  findings: PartsRequestFitFinding[],
  overrideReason: string | undefined,
): PartsRequestFitOverride | null {
  if (!findings.length) return null;
  const what = `The layout does not fit: ${countOf(findings.length, 'blocks-fit finding')} (${findings.map(fitFindingWords).join('; ')})`;
  if (!can(actor, 'parts.overrideFit')) {
    if (overrideReason)
      throw new HttpError(
        403,
        `overrideReason: only ${rolesFor('parts.overrideFit').join(' or ')} may order parts for a layout that does not fit. ${what}.`,
        'overrideReason',
        { findings },
      );
    throw refuse(findings, `${what}. Fix the layout first, or ask a technician to order with a reason.`);
  }
  if (!overrideReason)
    throw refuse(findings, `${what}. Fix the layout first, or give overrideReason (10 to 500 characters) to order anyway.`);
  return { reason: overrideReason, byUserId: actor.id, byName: actor.name, byRole: actor.role, at: new Date().toISOString(), findings };
}

/**
 * At submit: the findings the kept layout has now that its override (if any) did not cover.
 * Empty means the request may go.
 */
export function uncoveredAtSubmit(now: PartsRequestFitFinding[], override: PartsRequestFitOverride | null): PartsRequestFitFinding[] {
  const covered = new Set((override?.findings ?? []).map(findingKey));
  return now.filter((f) => !covered.has(findingKey(f)));
}

export function refuseAtSubmit(findings: PartsRequestFitFinding[]): HttpError {
  return refuse(
    findings,
    `The layout this request was made for does not fit any more: ${findings.map(fitFindingWords).join('; ')}. Nothing was sent; make a new request from the corrected layout (a technician may order anyway with a reason).`,
    'fit',
  );
}
