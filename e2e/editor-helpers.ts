import { expect, type Locator, type Page } from '@playwright/test';
import { signIn, type DEMO } from './helpers';

export interface Opened {
  machineId: string;
  layoutId: string;
}

/** Finds a machine's first layout through the API and opens it in the editor. */
export async function openEditor(page: Page, who: keyof typeof DEMO, nickname: string): Promise<Opened> {
  await signIn(page, who);
  const list = await page.request.get(`/api/machines?q=${encodeURIComponent(nickname)}`);
  expect(list.status()).toBe(200);
  const machine = ((await list.json()).items as { id: string; nickname: string }[]).find((m) => m.nickname === nickname);
  expect(machine, `machine ${nickname}`).toBeTruthy();
  const layouts = await page.request.get(`/api/machines/${machine!.id}/layouts`);
  expect(layouts.status()).toBe(200);
  const layoutId = ((await layouts.json()).layouts as { id: string }[])[0]!.id;
  await page.goto(`/machines/${machine!.id}/layouts/${layoutId}`);
  await expect(page.getByTestId('cage-editor')).toBeVisible();
  // Hydrated: the island's buttons work only after React has attached.
  await expect(page.locator('astro-island[ssr]')).toHaveCount(0);
  return { machineId: machine!.id, layoutId };
}

export const slot = (page: Page, key: string): Locator => page.getByTestId('diagram-pane').locator(`[data-place="${key}"]`);
export const announcer = (page: Page) => page.getByTestId('editor-announcer');
export const dndRegion = (page: Page) => page.locator('[id^="DndLiveRegion"]');
export const findingCount = async (page: Page) =>
  Number((await page.getByRole('heading', { name: /^Findings/ }).innerText()).match(/\((\d+)\)/)![1]);

/** Drags with real mouse moves in small steps (the pointer sensor needs to see movement). */
export async function mouseDrag(page: Page, from: Locator, to: Locator) {
  const a = (await from.boundingBox())!;
  const b = (await to.boundingBox())!;
  await page.mouse.move(a.x + a.width / 2, a.y + a.height / 2);
  await page.mouse.down();
  await page.mouse.move(a.x + a.width / 2 + 12, a.y + a.height / 2 + 4, { steps: 4 });
  await page.mouse.move(b.x + b.width / 2, b.y + b.height / 2, { steps: 12 });
  await page.mouse.move(b.x + b.width / 2 + 2, b.y + b.height / 2 + 2, { steps: 2 });
  await page.mouse.up();
}
