import { test, expect, type Page } from '@playwright/test';
import { shot, signIn } from './helpers';
import { demoCatalog, sedgeS6, starterLayout, tamarackM4 } from '~/lib/domain';

// The cage drawing at phone and desktop width: on the six-position cage, rotor-bar labels stay in
// their slot and never meet a finding's icon or a compare view's badge; element labels stay in
// their slot; compare marks vane and drum differences on the drawings. Measured with the
// browser's own text metrics (getBBox), not with the server's estimate.

type Box = { x: number; y: number; width: number; height: number };

/** Every label that leaves its slot or meets a mark in the diagrams of the page. */
async function collisions(page: Page) {
  return page.evaluate(() => {
    const out: string[] = [];
    const box = (el: Element) => (el as SVGGraphicsElement).getBBox();
    const meets = (a: Box, b: Box) => a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
    const inside = (a: Box, b: Box) =>
      a.x >= b.x - 0.5 && a.x + a.width <= b.x + b.width + 0.5 && a.y >= b.y - 0.5 && a.y + a.height <= b.y + b.height + 0.5;
    for (const slot of document.querySelectorAll(
      'svg[data-testid="cage-diagram"] g[data-place^="bar:"], svg[data-testid="cage-diagram"] g[data-place^="element:"]',
    )) {
      const place = slot.getAttribute('data-place')!;
      const frame = slot.querySelector('rect');
      if (!frame) continue;
      const area = box(frame);
      const marks = [...slot.querySelectorAll('[data-mark="severity"], [data-mark="changed"]')].map(box);
      const texts = place.startsWith('bar:')
        ? [...slot.querySelectorAll('text[data-bar-label]')]
        : [...slot.querySelectorAll(':scope > text, text')].filter((t) => !t.closest('[data-mark]'));
      for (const t of texts) {
        const b = box(t);
        if (b.width === 0) continue;
        if (!inside(b, area)) out.push(`${place}: “${t.textContent}” leaves its slot`);
        if (place.startsWith('bar:') && marks.some((m) => meets(b, m))) out.push(`${place}: “${t.textContent}” meets a badge`);
      }
    }
    return out;
  });
}

test('six-position cage: rotor labels, finding icons and compare badges do not collide; compare marks vanes and drum', async ({ page }) => {
  await signIn(page, 'technician');
  // A six-position machine whose cage holds bars of another family on the in-line places (blocks fit).
  const base = starterLayout(sedgeS6, 'corn', demoCatalog);
  const ownGroup = demoCatalog.find((p) => p.partNumber === base.rotorBars[0]!.partNumber)!.fitGroup;
  const foreign = demoCatalog.find((p) => p.kind === 'rotor-bar' && p.fitGroup !== ownGroup)!;
  const inLine = new Set(sedgeS6.rotorBarPlaces.filter((b) => b.inLine).map((b) => `${b.row}:${b.position}`));
  const layout = {
    ...base,
    vaneSetting: base.vaneSetting === 'slow' ? 'fast' : 'slow',
    rotorBars: base.rotorBars.map((b) =>
      inLine.has(`${b.row}:${b.position}`) || b.position === 1 ? { ...b, partNumber: foreign.partNumber } : b,
    ),
  };
  const machine = await page.request.post('/api/machines', {
    data: {
      familyId: sedgeS6.id,
      drum: sedgeS6.drumOptions[0]!.id,
      vaneControl: sedgeS6.vaneControls[0],
      serial: `FIT-${Date.now().toString(36)}`,
      nickname: 'Six-position fit',
    },
  });
  expect(machine.status()).toBe(201);
  const machineId = (await machine.json()).machine.id;
  const created = await page.request.post(`/api/machines/${machineId}/layouts`, {
    data: { name: 'Bars from another family', body: layout },
  });
  expect(created.status(), await created.text()).toBe(201);
  const { layout: saved, version } = await created.json();

  for (const width of [1440, 390]) {
    await page.setViewportSize({ width, height: 900 });
    // The editor's full drawing, with the findings on the bars.
    await page.goto(`/machines/${machineId}/layouts/${saved.id}`);
    await expect(page.locator('[data-testid="cage-diagram"] [data-mark="severity"]').first()).toBeAttached();
    expect(await collisions(page)).toEqual([]);
    await shot(page, `drawing-fit-editor-${width}`);

    // Compare against the crop's suggested start: changed bars with their badges, the vanes marked.
    await page.goto(`/classroom/compare?a=version:${version.id}&b=starter:${sedgeS6.id}:corn`);
    await expect(page.getByTestId('compare')).toBeVisible();
    expect(await page.locator('[data-testid="side-A"] [data-mark="changed"]').count()).toBeGreaterThan(0);
    expect(await collisions(page)).toEqual([]);
    for (const side of ['A', 'B']) {
      const diagram = page.getByTestId(`side-${side}`).getByTestId('cage-diagram');
      await expect(diagram.locator('[data-mark="vanes"]')).toHaveCount(2);
      await expect(diagram.locator('text', { hasText: 'Δ vanes' }).first()).toBeAttached();
    }
    await shot(page, `drawing-fit-compare-${width}`);
  }

  // A slim-drum layout against the full-drum start: the rotor strip is marked on both drawings.
  const slim = await page.request.post('/api/machines', {
    data: {
      familyId: tamarackM4.id,
      drum: 'slim',
      vaneControl: 'powered',
      serial: `FIT-S-${Date.now().toString(36)}`,
      nickname: 'Slim drum fit',
    },
  });
  const slimId = (await slim.json()).machine.id;
  const wheat = { ...starterLayout(tamarackM4, 'wheat', demoCatalog), drum: 'slim', vaneControl: 'powered' };
  const slimLayout = await page.request.post(`/api/machines/${slimId}/layouts`, { data: { name: 'Slim drum wheat', body: wheat } });
  expect(slimLayout.status(), await slimLayout.text()).toBe(201);
  const slimVersion = (await slimLayout.json()).version.id;
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto(`/classroom/compare?a=version:${slimVersion}&b=starter:${tamarackM4.id}:wheat`);
  await expect(page.getByTestId('side-A').locator('[data-mark="drum"]')).toHaveCount(1);
  await expect(page.getByTestId('side-B').locator('[data-mark="drum"]')).toHaveCount(1);
  await expect(page.getByTestId('side-A').locator('[data-mark="drum-words"]')).toContainText('Δ slim drum');
  await expect(page.getByTestId('side-B').locator('[data-mark="drum-words"]')).toContainText('Δ full drum');
  expect(await collisions(page)).toEqual([]);
  await shot(page, 'drawing-fit-compare-drum-1440');
});
