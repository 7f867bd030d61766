import { describe, expect, it } from 'vitest';
import { demoCatalog, starterLayout, tamarackM4, type Layout } from '~/lib/domain';
import type { Actor } from '~/lib/server/access';
import { HttpError } from '~/lib/server/http';
import { blockingFindings, judgeFit, refuseAtSubmit, uncoveredAtSubmit } from '~/lib/server/services/parts-requests/fit';

const actor = (role: Actor['role']): Actor => ({
  id: '00000000-0000-4000-8000-000000000001',
  email: 'someone@example.invalid',
  name: 'Some One',
  role,
  unitSystem: 'metric',
  memberOrgIds: [],
  visibleOrgIds: [],
  homeOrgId: '00000000-0000-4000-8000-000000000002',
  homeOrgKind: 'dealer',
});

const fits = starterLayout(tamarackM4, 'corn', demoCatalog) as Layout;
// Left and right elements differ in length, so a left-hand element never fits a right half
// (common practice, no published source).
const rightIndex = fits.elements.findIndex((e) => e.side === 'right');
const leftTwin = fits.elements.find((e) => e.side === 'left' && e.position === fits.elements[rightIndex]!.position)!;
const doubled: Layout = {
  ...fits,
  elements: fits.elements.map((e, i) => (i === rightIndex ? { ...e, partNumber: leftTwin.partNumber } : e)),
};
const REASON = 'Fitting the spare at the other half on site.';

function refusal(f: () => unknown): HttpError {
  try {
    f();
  } catch (e) {
    if (e instanceof HttpError) return e;
    throw e;
  }
  throw new Error('not refused');
}

describe('blocks-fit findings a request keeps', () => {
  it('none for the starter layout; one with its code, title and place in words for a left-hand element on the right', () => {
    expect(blockingFindings(tamarackM4, demoCatalog, fits)).toEqual([]);
    const found = blockingFindings(tamarackM4, demoCatalog, doubled);
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({
      code: 'FIT_HAND_MISMATCH',
      title: 'Left-hand element in the right half',
      places: [expect.stringMatching(/^position \d+, right$/)],
    });
  });
});

describe('judging a new request', () => {
  const findings = blockingFindings(tamarackM4, demoCatalog, doubled);

  it('a layout that fits needs nothing, whoever asks, and a reason given is not kept', () => {
    expect(judgeFit(actor('operator'), [], undefined)).toBeNull();
    expect(judgeFit(actor('technician'), [], REASON)).toBeNull();
  });

  it('without a reason: 409 naming overrideReason and the findings, for every role', () => {
    for (const role of ['operator', 'technician', 'dealer_admin'] as const) {
      const e = refusal(() => judgeFit(actor(role), findings, undefined));
      expect(e.status).toBe(409);
      expect(e.field).toBe('overrideReason');
      expect(e.extra).toEqual({ findings });
      expect(e.message).toContain('FIT_HAND_MISMATCH');
    }
  });

  it('an operator with a reason: 403 naming overrideReason', () => {
    const e = refusal(() => judgeFit(actor('operator'), findings, REASON));
    expect(e.status).toBe(403);
    expect(e.field).toBe('overrideReason');
  });

  it('a technician or dealer administrator with a reason: the override with who, when and the findings', () => {
    for (const role of ['technician', 'dealer_admin'] as const) {
      const o = judgeFit(actor(role), findings, REASON)!;
      expect(o).toMatchObject({ reason: REASON, byName: 'Some One', byRole: role, findings });
      expect(Number.isNaN(Date.parse(o.at))).toBe(false);
    }
  });
});

describe('checking again at submit', () => {
  const findings = blockingFindings(tamarackM4, demoCatalog, doubled);
  const override = judgeFit(actor('technician'), findings, REASON)!;
  const other = { code: 'FIT_POSITION_UNKNOWN', title: 'No position 40 on this cage', places: ['position 40, left'] };

  it('findings the override covered let it go; a new one (rules or catalog changed) does not', () => {
    expect(uncoveredAtSubmit(findings, override)).toEqual([]);
    expect(uncoveredAtSubmit([...findings, other], override)).toEqual([other]);
  });

  it('without an override every blocks-fit finding stops it; a layout that fits goes', () => {
    expect(uncoveredAtSubmit(findings, null)).toEqual(findings);
    expect(uncoveredAtSubmit([], null)).toEqual([]);
  });

  it('the refusal at submit is a 409 naming fit and the findings', () => {
    const e = refuseAtSubmit([other]);
    expect(e.status).toBe(409);
    expect(e.field).toBe('fit');
    expect(e.extra).toEqual({ findings: [other] });
  });

  it('the same code at another place is not covered', () => {
    const moved = findings.map((f) => ({ ...f, places: ['position 9, right'] }));
    expect(uncoveredAtSubmit(moved, override)).toEqual(moved);
  });
});
