import { expect, test } from '@playwright/test';
import { shot, signIn } from './helpers';

test('plan a crop change, accept it, make a parts request and send it; the desk moves it on', async ({ page, browser }) => {
  // The dealer's shelf as this test reads it (other specs in the run may have used or restocked
  // these parts): the left round bars in stock, the right ones to order in about 9 days.
  const desk = await browser.newContext();
  const deskPage = await desk.newPage();
  await signIn(deskPage, 'dealerAdmin');
  for (const [part, stock] of [
    ['CW-RB-L-04', { quantity: 4, leadDays: 5 }],
    ['CW-RB-R-04', { quantity: 0, leadDays: 9 }],
  ] as const) {
    const res = await deskPage.request.put(`/api/dealer-stock/${part}`, { data: stock });
    expect(res.status(), await res.text()).toBe(200);
  }
  await desk.close();
  await signIn(page, 'operator', '/planner');
  await page.goto('/planner');
  await page.getByLabel('Machine').selectOption({ label: 'North Quarter · Tamarack M4' });
  await page.getByLabel('Next crop').selectOption({ label: 'Field peas' });
  await page.getByRole('button', { name: 'Plan the change' }).click();

  // The proposal beside what is installed, the cautions before the steps.
  await expect(page.getByTestId('plan-heading')).toHaveText('North Quarter: wheat → field peas');
  await expect(page.getByTestId('plan-summary')).toContainText(
    /4 parts to buy, about \d+ h( \d+ min)? of work, [\d.,]+ (kg|lb) lifted, 3 settings to change\./,
  );
  await expect(page.getByTestId('cage-diagram')).toHaveCount(2);
  const cautions = page.getByTestId('work-cautions');
  await expect(cautions).toContainText('Engine off, key out');
  await expect(cautions).toContainText('operator’s manual');
  const steps = page.getByTestId('plan-steps').locator('li');
  // Parts first (the left bars are on the dealer's shelf, the right ones on order, then the wait
  // for them), then four places emptied and filled one by one, then nine set-and-verify steps
  // ending with the loss check.
  await expect(steps).toHaveCount(2 + 1 + 8 + 9);
  await expect(steps.first()).toContainText("Collect 2 × CW-RB-L-04 (left-hand round-bar element) from the dealer, on the dealer's shelf");
  await expect(steps.nth(1)).toContainText('Order 2 × CW-RB-R-04');
  await expect(steps.nth(1)).toContainText('to order, about 9 days');
  await expect(steps.nth(2)).toContainText('Wait until every part on order has arrived');
  await expect(steps.nth(3)).toContainText('Take off the left-hand fine-wire element CW-FW-L-04 at position 1, left');
  await expect(steps.nth(4)).toContainText('Fit the left-hand round-bar element CW-RB-L-04 (new) at position 1, left');
  await expect(steps.last()).toContainText('Check the losses in the first field');
  await expect(steps.last().getByRole('link', { name: 'Open the field check' })).toHaveAttribute('href', '/field-check');
  const cautionsBox = await cautions.boundingBox();
  const firstStep = await steps.first().boundingBox();
  expect(cautionsBox!.y).toBeLessThan(firstStep!.y);
  await expect(page.getByTestId('plan-purchases')).toContainText('CA$5,240.00');
  await shot(page, 'planner-proposal');

  // Accept as a new layout version.
  await page.getByLabel('Name of the new layout').fill('Peas for July');
  await page.getByRole('button', { name: 'Accept as a layout version' }).click();
  await expect(page.getByTestId('accepted-notice')).toContainText('Saved as version 1 of “Peas for July”');
  const editorLink = page.getByRole('link', { name: 'Open it in the editor' });
  await expect(editorLink).toHaveAttribute('href', /^\/machines\/[0-9a-f-]+\/layouts\/[0-9a-f-]+$/);

  // Turn the purchases into a parts request.
  await page.getByRole('button', { name: 'Make a parts request' }).click();
  await expect(page).toHaveURL(/\/parts-requests\/[0-9a-f-]+\?created=1$/);
  await expect(page.getByTestId('request-status')).toContainText('Draft');
  const table = page.getByTestId('bom-table');
  await expect(table.locator('tbody tr')).toHaveCount(2);
  await expect(page.getByTestId('bom-total')).toHaveText('CA$5,240.00');
  await expect(page.getByTestId('work-cautions')).toBeVisible();

  // A negative quantity is refused and nothing changes.
  await page.getByLabel('Quantity of CW-RB-L-04').fill('-1');
  await page.getByRole('button', { name: 'Save quantities' }).click();
  await expect(page.getByTestId('request-problem')).toContainText('check the marked quantities');
  await expect(page.getByText('cannot be negative')).toBeVisible();
  await shot(page, 'parts-request-bad-quantity');
  await page.goto(page.url().replace(/\?.*$/, ''));
  await expect(page.getByTestId('bom-total')).toHaveText('CA$5,240.00');

  // One spare of the left-hand element, then send it.
  await page.getByLabel('Quantity of CW-RB-L-04').fill('3');
  await page.getByRole('button', { name: 'Save quantities' }).click();
  await expect(page.getByTestId('request-notice')).toHaveText('Quantities saved.');
  await expect(page.getByTestId('bom-total')).toHaveText('CA$6,550.00');
  await page.getByRole('button', { name: 'Send to the parts desk' }).click();
  await expect(page.getByTestId('request-notice')).toContainText('Sent to the parts desk of Kestrel Valley Implement');
  await expect(page.getByTestId('request-status')).toContainText('Sent to the parts desk');
  await expect(page.getByLabel('Quantity of CW-RB-L-04')).toHaveCount(0);
  const number = (await page.getByTestId('request-heading').innerText()).replace('Parts request ', '').trim();
  const requestUrl = page.url().replace(/\?.*$/, '');
  await shot(page, 'parts-request-sent');
  // The printable sheet: cautions and parts, no buttons.
  await page.emulateMedia({ media: 'print' });
  await expect(page.getByRole('button', { name: 'Print sheet' })).toBeHidden();
  await expect(page.getByTestId('work-cautions')).toBeVisible();
  await shot(page, 'parts-request-print');
  await page.emulateMedia({ media: 'screen' });

  // The message in the fake mailbox, as the dealer's administrator sees it.
  const adminContext = await browser.newContext();
  const admin = await adminContext.newPage();
  await signIn(admin, 'dealerAdmin', '/admin/mailbox');
  await admin.goto('/admin/mailbox');
  const message = admin.getByTestId('mailbox').locator('li').filter({ hasText: number }).first();
  await expect(message).toContainText(`Parts request ${number} from Larkspur Farms: North Quarter (Tamarack M4)`);
  await expect(message).toContainText('to parts@kestrel.example · copy to olive@larkspur.example');
  await expect(message.locator('pre')).toContainText('3 × CW-RB-L-04');
  await shot(admin, 'admin-mailbox');
  await adminContext.close();

  // The dealer's technician acknowledges it; the owner sees the new status.
  const techContext = await browser.newContext();
  const tech = await techContext.newPage();
  await signIn(tech, 'technician', '/parts-requests');
  await tech.goto('/parts-requests');
  await tech.getByTestId('requests-incoming').getByRole('link', { name: number }).click();
  await tech.getByRole('button', { name: 'Mark as acknowledged' }).click();
  await expect(tech.getByTestId('request-status')).toContainText('Acknowledged');
  await shot(tech, 'parts-request-desk');
  await techContext.close();

  await page.goto(requestUrl);
  await expect(page.getByTestId('request-status')).toContainText('Acknowledged');
});

test('accept and adjust: the plan opens in the editor', async ({ page }) => {
  await signIn(page, 'operator2', '/planner');
  await page.goto('/planner');
  await page.getByLabel('Machine').selectOption({ label: 'Creekside · Sedge S6' });
  await page.getByLabel('Next crop').selectOption({ label: 'Soybeans' });
  await page.getByLabel('Suitable parts on hand first').check();
  await page.getByRole('button', { name: 'Plan the change' }).click();
  await expect(page.getByTestId('plan-heading')).toHaveText('Creekside: corn → soybeans');
  await shot(page, 'planner-split-on-hand');
  await page.getByRole('button', { name: 'Accept and adjust in the editor' }).click();
  await expect(page).toHaveURL(/\/machines\/[0-9a-f-]+\/layouts\/[0-9a-f-]+$/);
  await shot(page, 'planner-into-editor', false);
});
