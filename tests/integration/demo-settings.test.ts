/**
 * The demo data is honest under the settings rules: every seeded machine's installed layout and
 * first saved version start slow and wide on the machine's own drum and vanes, and raise no
 * blocks-fit or hurts-crop finding; a deck slide carries one only where it is there to teach it
 * and says so in its notes.
 */
import { isDeepStrictEqual } from 'node:util';
import { describe, expect, it } from 'vitest';
import { signedIn } from './client';
import { cropPrograms, demoFamilies, drumFor, rpmWindow, startRpm, vaneSettingsFor, type Finding, type Layout } from '~/lib/domain';

const serious = (fs: Finding[]) => fs.filter((f) => f.severity !== 'advice').map((f) => f.code);

describe('demo layouts under the settings rules', () => {
  it('every seeded machine: starter settings on its own drum and vanes, no blocks-fit or hurts-crop finding', async () => {
    const admin = await signedIn('dealerAdmin');
    type Row = { id: string; nickname: string; familyId: string; drum: 'full' | 'slim'; vaneControl: 'fixed' | 'manual' | 'powered' };
    // Each demo machine found by its name (other suites on the shared server add machines, so
    // the first page of the list need not hold them).
    const machines: Row[] = [];
    for (const name of ['Bean Runner', 'Creekside', 'North Quarter']) {
      const found = ((await admin.get(`/api/machines?q=${encodeURIComponent(name)}&pageSize=100`)).body.items as Row[]).filter(
        (m) => m.nickname === name,
      );
      expect(found, name).toHaveLength(1);
      machines.push(found[0]!);
    }
    expect(machines.some((m) => m.drum === 'slim')).toBe(true);
    for (const m of machines.filter((x) => ['Bean Runner', 'Creekside', 'North Quarter'].includes(x.nickname))) {
      const family = demoFamilies.find((f) => f.id === m.familyId)!;
      const layouts = (await admin.get(`/api/machines/${m.id}/layouts`)).body.layouts as { id: string; name: string }[];
      const first = layouts.find((l) => / setup$/.test(l.name))!;
      const v1 = (await admin.get(`/api/layouts/${first.id}/versions/1`)).body;
      const body: Layout = v1.body ?? v1.version?.body;
      expect(body.drum, m.nickname).toBe(m.drum);
      expect(body.vaneControl, m.nickname).toBe(m.vaneControl);
      const w = rpmWindow(body.crop, { id: body.drum, diameterMm: drumFor(family, body.drum).diameterMm });
      // The slim-drum machine runs its crop 100 rpm higher (common practice, no published source).
      expect(body.rotorRpm, m.nickname).toBe(startRpm(w));
      expect(body.clearanceMm, m.nickname).toBe(cropPrograms[body.crop].clearanceMm.maxMm);
      expect(vaneSettingsFor(body.vaneControl), m.nickname).toContain(body.vaneSetting);
      const checked = await admin.post('/api/check', { layout: body });
      expect(checked.status).toBe(200);
      expect(serious(checked.body.findings), m.nickname).toEqual([]);
      // The seed installs exactly that first version. Other suites share this server and may
      // have installed something else since; then the first version, checked above, is what the
      // seed installed, and the installed layout's findings are theirs, not the seed's.
      const installed = (await admin.get(`/api/machines/${m.id}/installed`)).body;
      if (isDeepStrictEqual(installed.installed?.layout, body)) {
        expect(serious(installed.findings), `${m.nickname} installed`).toEqual([]);
      }
    }
  });

  it('the trainer deck: a slide with a blocks-fit or hurts-crop finding says it teaches what goes wrong', async () => {
    const trainer = await signedIn('trainer');
    const decks = (await trainer.get('/api/decks')).body.decks as { id: string; title: string }[];
    const deck = decks.find((d) => d.title === 'Small grains vs pulses')!;
    const slides = (await trainer.get(`/api/decks/${deck.id}`)).body.slides as { title: string; notes: string; layout: Layout | null }[];
    expect(slides.length).toBeGreaterThan(0);
    for (const s of slides) {
      if (!s.layout) continue;
      const checked = await trainer.post('/api/check', { layout: s.layout });
      expect(checked.status).toBe(200);
      const codes = serious(checked.body.findings);
      if (codes.length) expect(s.title, `${s.title}: ${codes.join(', ')}`).toMatch(/what goes wrong/i);
      else expect(s.title).not.toMatch(/what goes wrong/i);
    }
  });
});
