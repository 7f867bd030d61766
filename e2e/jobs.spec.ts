import { expect, test } from '@playwright/test';
import { demoCatalog, starterLayout, tamarackM4 } from '~/lib/domain';
import { shot, signIn } from './helpers';

test('an accepted plan becomes a job card, worked step by step, hours read, checklist answered and signed off', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, 'technician', '/jobs');

  // A machine of Larkspur Farms of our own with the wheat cage in it, so no other spec's machine changes.
  const { orgs } = (await (await page.request.get('/api/orgs')).json()) as { orgs: { id: string; name: string }[] };
  const larkspur = orgs.find((o) => o.name === 'Larkspur Farms')!;
  expect(larkspur).toBeDefined();
  const nickname = `Job Runner ${Date.now().toString(36)}`;
  const made = await page.request.post('/api/machines', {
    data: {
      orgId: larkspur.id,
      familyId: tamarackM4.id,
      drum: 'full',
      vaneControl: 'fixed',
      serial: `JR-${Date.now().toString(36)}`,
      nickname,
    },
  });
  expect(made.status(), await made.text()).toBe(201);
  const machineId: string = (await made.json()).machine.id;
  const wheat = { ...starterLayout(tamarackM4, 'wheat', demoCatalog), drum: 'full' as const, vaneControl: 'fixed' as const };
  expect((await page.request.put(`/api/machines/${machineId}/installed`, { data: { layout: wheat } })).status()).toBe(200);

  // Plan the change to field peas and accept it; make the job card from the accepted version.
  await page.goto('/planner');
  await page.getByLabel('Machine').selectOption({ label: `${nickname} · ${tamarackM4.name}` });
  await page.getByLabel('Next crop').selectOption({ label: 'Field peas' });
  await page.getByRole('button', { name: 'Plan the change' }).click();
  const planSteps = await page.getByTestId('plan-steps').locator('li').count();
  await page.getByLabel('Name of the new layout').fill('Peas for the job');
  await page.getByRole('button', { name: 'Accept as a layout version' }).click();
  await expect(page.getByTestId('accepted-notice')).toContainText('Saved as version 1 of “Peas for the job”');
  await page.getByRole('button', { name: 'Make a job card for this version' }).click();
  await expect(page).toHaveURL(/\/jobs\/[0-9a-f-]+$/);
  const jobUrl = new URL(page.url()).pathname;

  await expect(page.getByTestId('job-status')).toHaveText('Planned');
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Fit Peas for the job, version 1');
  const cautions = page.getByTestId('job-cautions');
  await expect(cautions).toContainText('Lock the rotor');
  await expect(cautions).toContainText('lifting aid');
  await expect(cautions).toContainText('operator’s manual');
  const steps = page.getByTestId('job-steps').locator('li');
  // The planner's steps, in its working order.
  await expect(steps).toHaveCount(planSteps);
  await expect(steps.last()).toContainText('Check the losses in the first field');
  await expect(page.getByTestId('job-parts')).toContainText('CW-RB-L-04');
  await shot(page, 'job-planned-1440');
  await page.setViewportSize({ width: 390, height: 844 });
  await shot(page, 'job-planned-390');
  await page.setViewportSize({ width: 1440, height: 900 });

  // Start: assigned to the technician who starts it.
  await page.getByRole('button', { name: 'Start the work' }).click();
  await expect(page.getByTestId('job-status')).toHaveText('In progress');
  await expect(page.getByTestId('job-assignee')).toHaveText('Tomas Reyes');

  // The work can be handed over while it is in progress (and handed back).
  const handover = page.getByTestId('handover-form');
  const others = (await handover.getByRole('combobox').locator('option').allTextContents()).filter((t) => t !== 'Tomas Reyes');
  expect(others.length).toBeGreaterThan(0);
  await handover.getByRole('combobox').selectOption({ label: others[0]! });
  await handover.getByRole('button', { name: 'Hand over' }).click();
  await expect(page.getByTestId('job-notice')).toHaveText('Assignee saved.');
  await expect(page.getByTestId('job-assignee')).toHaveText(others[0]!);
  await page.getByTestId('handover-form').getByRole('combobox').selectOption({ label: 'Tomas Reyes' });
  await page.getByTestId('handover-form').getByRole('button', { name: 'Hand over' }).click();
  await expect(page.getByTestId('job-assignee')).toHaveText('Tomas Reyes');

  // Done needs every step ticked: the first by keyboard, the rest by pointer.
  const boxes = page.getByTestId('job-steps').getByRole('checkbox');
  await boxes.first().focus();
  await page.keyboard.press('Space');
  await expect(boxes.first()).toBeChecked();
  const n = await boxes.count();
  for (let i = 1; i < n; i++) await boxes.nth(i).check();
  await page.getByRole('button', { name: 'Save the ticked steps' }).click();
  await expect(page.getByTestId('job-notice')).toHaveText('Steps saved.');
  await expect(page.getByTestId('job-steps').locator('li[data-done="yes"]')).toHaveCount(n);

  // The hours are read with the move to done; the layout version is then installed.
  await page.getByLabel('Engine hours').fill('1520');
  await page.getByLabel('Separator hours').fill('1101.5');
  await page.getByRole('button', { name: 'The work is done' }).click();
  await expect(page.getByTestId('job-status')).toHaveText('Done');
  await expect(page.getByTestId('job-hours')).toContainText('engine 1,520 h, separator 1,101.5 h');
  const installed = await (await page.request.get(`/api/machines/${machineId}/installed`)).json();
  expect(installed.installed.layout.crop).toBe('field-peas');

  // An incomplete checklist is refused, naming what is missing.
  const form = page.getByTestId('sign-off-form');
  await form.getByLabel('Concave zeroed and levelled').check();
  await form.getByLabel('Clearance set').check();
  await form.getByRole('button', { name: /Sign off as/ }).click();
  await expect(page.getByTestId('job-problem')).toContainText('still missing');
  for (const label of [
    'Bolts torqued to the catalog’s values',
    'Rotor turned by hand',
    'Guards back on',
    'Test run',
    'Loss check done or booked',
  ])
    await expect(page.getByTestId('job-problem')).toContainText(label);
  await expect(page.getByTestId('job-status')).toHaveText('Done');
  // What was ticked is kept on the form.
  await expect(form.getByLabel('Concave zeroed and levelled')).toBeChecked();
  await shot(page, 'job-sign-off-refused-1440');

  for (const label of ['Bolts torqued to the catalog’s values', 'Rotor turned by hand', 'Guards back on', 'Test run'])
    await form.getByLabel(label).check();
  await form.getByLabel('Booked with the operator').check();
  await form.getByRole('button', { name: /Sign off as/ }).click();
  await expect(page.getByTestId('job-status')).toHaveText('Signed off');
  await expect(page.getByTestId('job-signed-off')).toContainText('Tomas');
  await expect(page.getByTestId('job-signed-off')).toContainText('the owner was told by e-mail');
  await shot(page, 'job-signed-off-1440');
  await page.setViewportSize({ width: 390, height: 844 });
  await shot(page, 'job-signed-off-390');

  // The printable job sheet.
  await page.goto(`${jobUrl}/sheet`);
  await expect(page.getByTestId('job-sheet')).toContainText('Lock the rotor');
  await expect(page.getByTestId('job-sheet')).toContainText('Signed off by: Tomas');
  // The Print button prints (a bundled script, not an inline handler the CSP would refuse).
  await page.evaluate(() => {
    (window as unknown as { printed: number }).printed = 0;
    window.print = () => void (window as unknown as { printed: number }).printed++;
  });
  await page.getByRole('button', { name: 'Print' }).click();
  expect(await page.evaluate(() => (window as unknown as { printed: number }).printed)).toBe(1);
  await shot(page, 'job-sheet-390');
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.emulateMedia({ media: 'print' });
  await shot(page, 'job-sheet-print-1440');
});
