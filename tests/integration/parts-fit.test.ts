import { beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from './client';
import { newLayout, saveChanged } from './fleet-helpers';
import { mailbox, ownMachine, tableCounts } from './planner-helpers';

/**
 * No order for a layout that does not fit: a request from a layout with blocks-fit findings is a
 * 409 naming them; a technician or dealer administrator may order anyway with a reason, which is
 * kept, shown on the request page and sheet, and carried in the e-mail to the parts desk.
 */
let olive: Client;
let tomas: Client;
let admin: Client;
let noor: Client;
let machineId: string;
let unfitId: string;
let fitId: string;

const digests = async () => (await noor.get('/api/admin/stats?digest=1')).body.digests as Record<string, string>;
const REASON = 'Right-hand element is on the farm shelf already; the left one is a spare.';

beforeAll(async () => {
  [olive, tomas, admin, noor] = await Promise.all([
    signedIn('operator'),
    signedIn('technician'),
    signedIn('dealerAdmin'),
    signedIn('instanceAdmin'),
  ]);
  ({ machineId } = await ownMachine(olive, 'Fit override test machine'));
  // A corn layout fits (the starter layout); a left-hand element in a right half does not: left
  // and right elements differ in length (common practice, no published source).
  fitId = (await newLayout(olive, machineId, 'Corn that fits', 'corn')).layout.id;
  unfitId = (await newLayout(olive, machineId, 'Corn with a left element on the right', 'corn')).layout.id;
  await saveChanged(olive, unfitId, (body) => {
    const right = body.elements.find((e: { side: string }) => e.side === 'right');
    right.partNumber = body.elements.find(
      (e: { side: string; position: number }) => e.side === 'left' && e.position === right.position,
    ).partNumber;
  });
});

describe('a parts request for a layout that does not fit', () => {
  it('is refused with a 409 naming the findings (code, title, places), and nothing is written', async () => {
    const before = await digests();
    for (const c of [olive, tomas]) {
      const res = await c.post('/api/parts-requests', { from: 'layout', layoutId: unfitId });
      expect(res.status, JSON.stringify(res.body)).toBe(409);
      expect(res.body.error.field).toBe('overrideReason');
      expect(res.body.error.findings).toEqual([
        expect.objectContaining({
          code: 'FIT_HAND_MISMATCH',
          title: 'Left-hand element in the right half',
          places: [expect.stringMatching(/^position \d+, right$/)],
        }),
      ]);
      expect(res.body.error.message).toContain('FIT_HAND_MISMATCH');
    }
    expect(await digests()).toEqual(before);
  });

  it('an operator cannot override: 403 naming overrideReason, nothing written', async () => {
    const before = await digests();
    const res = await olive.post('/api/parts-requests', { from: 'layout', layoutId: unfitId, overrideReason: REASON });
    expect(res.status).toBe(403);
    expect(res.body.error.field).toBe('overrideReason');
    expect(res.body.error.findings.map((f: { code: string }) => f.code)).toEqual(['FIT_HAND_MISMATCH']);
    expect(await digests()).toEqual(before);
  });

  it('a reason too short, too long or blank is a 400 naming overrideReason, nothing written', async () => {
    const before = await digests();
    for (const overrideReason of ['too short', '   short    ', 'x'.repeat(501), 42]) {
      const res = await tomas.post('/api/parts-requests', { from: 'layout', layoutId: unfitId, overrideReason });
      expect(res.status, JSON.stringify(overrideReason)).toBe(400);
      expect(res.body.error.field).toBe('overrideReason');
    }
    expect(await digests()).toEqual(before);
  });

  it('a layout that fits needs no reason; a reason given there is not kept', async () => {
    const plain = await olive.post('/api/parts-requests', { from: 'layout', layoutId: fitId });
    expect(plain.status, JSON.stringify(plain.body)).toBe(201);
    expect(plain.body.fitOverride).toBeNull();
    const withReason = await tomas.post('/api/parts-requests', { from: 'layout', layoutId: fitId, overrideReason: REASON });
    expect(withReason.status).toBe(201);
    expect(withReason.body.fitOverride).toBeNull();
    for (const id of [plain.body.id, withReason.body.id]) expect((await olive.delete(`/api/parts-requests/${id}`)).status).toBe(200);
  });

  it('a technician overrides with a reason: kept (trimmed) with who, when and the findings; audited; on the page; in the e-mail', async () => {
    const started = Date.now();
    const counts = await tableCounts(noor);
    const res = await tomas.post('/api/parts-requests', { from: 'layout', layoutId: unfitId, overrideReason: `  ${REASON}  ` });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const o = res.body.fitOverride;
    expect(o).toMatchObject({ reason: REASON, byName: 'Tomas Reyes', byRole: 'technician' });
    expect(Date.parse(o.at)).toBeGreaterThanOrEqual(started - 5_000);
    expect(o.findings.map((f: { code: string }) => f.code)).toEqual(['FIT_HAND_MISMATCH']);
    // Kept: read back by the farm's operator.
    const again = await olive.get(`/api/parts-requests/${res.body.id}`);
    expect(again.body.fitOverride).toEqual(o);

    // Audited: the request's creation and the override, two rows in the same transaction.
    const after = await tableCounts(noor);
    expect(after.auditLog).toBe(counts.auditLog! + 2);
    expect(after.partsRequests).toBe(counts.partsRequests! + 1);

    // The request page, printed as the sheet, shows the override section outside the screen-only parts.
    const page = await olive.fetch(`/parts-requests/${res.body.id}`);
    expect(page.status).toBe(200);
    const html = (await page.text()).replace(/\s+/g, ' ');
    const section = html.slice(html.indexOf('data-testid="request-fit-override"'));
    expect(section).toContain('Ordered for a layout that does not fit');
    expect(section).toContain(REASON);
    expect(section).toContain('Tomas Reyes (service technician)');
    expect(section).toContain('FIT_HAND_MISMATCH');
    expect(
      html.slice(
        html.lastIndexOf('<section', html.indexOf('data-testid="request-fit-override"')),
        html.indexOf('data-testid="request-fit-override"'),
      ),
    ).not.toContain('no-print');

    // Sent: the mail to the parts desk carries the override, the reason, who and the findings.
    const sent = await olive.post(`/api/parts-requests/${res.body.id}/submit`);
    expect(sent.status, JSON.stringify(sent.body)).toBe(200);
    const mail = (await mailbox(admin)).messages.find((m) => m.subject.includes(res.body.number))!;
    expect(mail.text).toContain('ORDERED FOR A LAYOUT THAT DOES NOT FIT');
    expect(mail.text).toContain(`Reason:       ${REASON}`);
    expect(mail.text).toMatch(/Override by: {2}Tomas Reyes \(service technician\)/);
    expect(mail.text).toMatch(/ {2}- Left-hand element in the right half \(FIT_HAND_MISMATCH\) at position \d+, right/);
  });

  it('a dealer administrator may override too', async () => {
    const res = await admin.post('/api/parts-requests', { from: 'layout', layoutId: unfitId, overrideReason: REASON });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.fitOverride).toMatchObject({ byRole: 'dealer_admin', reason: REASON });
    expect((await admin.delete(`/api/parts-requests/${res.body.id}`)).status).toBe(200);
  });

  it('a request from a fitting layout is still sent without a word about fit', async () => {
    const res = await olive.post('/api/parts-requests', { from: 'layout', layoutId: fitId });
    expect(res.status).toBe(201);
    const sent = await olive.post(`/api/parts-requests/${res.body.id}/submit`);
    expect(sent.status).toBe(200);
    const mail = (await mailbox(admin)).messages.find((m) => m.subject.includes(res.body.number))!;
    expect(mail.text).not.toContain('DOES NOT FIT');
  });

  it('is checked again at submit: a blocks-fit finding the override did not cover (the catalog changed) refuses the send, nothing written or mailed', async () => {
    const made = await tomas.post('/api/parts-requests', { from: 'layout', layoutId: unfitId, overrideReason: REASON });
    expect(made.status).toBe(201);
    // The part at position 1, left (and, wrongly, at position 1, right) is said to fit the separating zone only.
    const body = (await olive.get(`/api/layouts/${unfitId}`)).body.current.body;
    const pn: string = body.elements.find((e: { position: number; side: string }) => e.position === 1 && e.side === 'left').partNumber;
    const original = (await noor.get(`/api/catalog/parts/${pn}`)).body.part;
    const put = (spec: unknown) =>
      noor.put(`/api/catalog/parts/${pn}`, { familyId: original.familyId, active: original.active, part: spec });
    expect((await put({ ...original.spec, zones: ['separating'] })).status).toBe(200);
    try {
      const mails = (await mailbox(admin)).total;
      const before = await digests();
      const res = await olive.post(`/api/parts-requests/${made.body.id}/submit`);
      expect(res.status, JSON.stringify(res.body)).toBe(409);
      expect(res.body.error.field).toBe('fit');
      const codes = res.body.error.findings.map((f: { code: string }) => f.code);
      expect(codes.length).toBeGreaterThan(0);
      expect(new Set(codes)).toEqual(new Set(['FIT_ZONE_FORBIDDEN']));
      expect(await digests()).toEqual(before);
      expect((await mailbox(admin)).total).toBe(mails);
      expect((await olive.get(`/api/parts-requests/${made.body.id}`)).body.status).toBe('draft');
    } finally {
      expect((await put(original.spec)).status).toBe(200);
    }
    // The catalog as it was: the override covers what is left, and it goes.
    expect((await olive.post(`/api/parts-requests/${made.body.id}/submit`)).status).toBe(200);
  });
});
