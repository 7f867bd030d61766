import { describe, expect, it } from 'vitest';
import { Client, signedIn } from './client';
import { demoCatalog, demoFamilies } from '~/lib/domain/demo-catalog';
import { starterLayout } from '~/lib/domain/starter';

const family = demoFamilies.find((f) => f.cageKind === 'modular')!;
const valid = starterLayout(family, 'wheat', demoCatalog);

describe('POST /api/check', () => {
  it('needs a session', async () => {
    expect((await new Client().post('/api/check', { layout: valid })).status).toBe(401);
  });

  it('returns findings and computed settings for a valid layout, for every role', async () => {
    for (const who of ['operator', 'technician', 'trainer', 'dealerAdmin', 'instanceAdmin'] as const) {
      const c = await signedIn(who);
      const res = await c.post('/api/check', { layout: valid });
      expect(res.status).toBe(200);
      expect(Array.isArray(res.body.findings)).toBe(true);
      expect(res.body.findings.every((f: { severity: string }) => f.severity === 'advice')).toBe(true);
      expect(res.body.settings.tipSpeedMs).toBeGreaterThan(0);
    }
  });

  it('reports a hand mismatch as a blocking finding on that place', async () => {
    const c = await signedIn('operator');
    const left = valid.elements.find((e) => e.side === 'left')!;
    const layout = {
      ...valid,
      elements: valid.elements.map((e) => (e.position === left.position && e.side === 'right' ? { ...e, partNumber: left.partNumber } : e)),
    };
    const res = await c.post('/api/check', { layout });
    expect(res.status).toBe(200);
    const hand = res.body.findings.find((f: { code: string }) => f.code === 'FIT_HAND_MISMATCH');
    expect(hand.severity).toBe('blocks-fit');
    expect(hand.places).toContainEqual({ kind: 'element', position: left.position, side: 'right' });
  });

  it('names the field for bad input: unknown element, wrong types, absurd rpm, missing fields', async () => {
    const c = await signedIn('technician');
    const cases: [unknown, string][] = [
      [{ layout: { ...valid, elements: [{ ...valid.elements[0]!, partNumber: 'CW-NOPE-L-99' }] } }, 'layout.elements.0.partNumber'],
      [{ layout: { ...valid, rotorRpm: 'fast' } }, 'layout.rotorRpm'],
      [{ layout: { ...valid, rotorRpm: 99999 } }, 'layout.rotorRpm'],
      [{ layout: { ...valid, crop: undefined } }, 'layout.crop'],
      [{ layout: { ...valid, familyId: 'no-such-family' } }, 'layout.familyId'],
      [{}, 'layout'],
    ];
    for (const [body, field] of cases) {
      const res = await c.post('/api/check', body);
      expect(res.status, JSON.stringify(body).slice(0, 80)).toBe(400);
      expect(res.body.error.field).toBe(field);
    }
    const notJson = await c.fetch('/api/check', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{oops' });
    expect(notJson.status).toBe(400);
  });
});

describe('POST /api/check keeps the catalog between calls, and sees it change', () => {
  it('knows a part added by the instance administrator at once, and forgets it once retired', async () => {
    const ada = await signedIn('instanceAdmin');
    const c = await signedIn('operator');
    // Warm the kept catalog.
    expect((await c.post('/api/check', { layout: valid })).status).toBe(200);
    const left = valid.elements.find((e) => e.side === 'left')!;
    const original = demoCatalog.find((p) => p.partNumber === left.partNumber)!;
    const pn = `CW-CACHE-${Date.now().toString(36).toUpperCase()}`;
    const created = await ada.post('/api/catalog/parts', {
      familyId: family.id,
      active: true,
      part: { ...original, partNumber: pn, name: 'Cache probe element' },
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const i = valid.elements.indexOf(left);
    const layout = { ...valid, elements: valid.elements.map((e, j) => (j === i ? { ...e, partNumber: pn } : e)) };
    const known = await c.post('/api/check', { layout });
    expect(known.status, JSON.stringify(known.body)).toBe(200);

    expect((await ada.delete(`/api/catalog/parts/${pn}`)).status).toBe(200);
    const gone = await c.post('/api/check', { layout });
    expect(gone.status).toBe(400);
    expect(gone.body.error.field).toBe(`layout.elements.${i}.partNumber`);
  });
});
