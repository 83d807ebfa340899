import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { addBin, addPart, replacedBy, signIn } from './stock-api';

test('receive into a bin, find it through a superseded number, hold it, issue it, and see the value change', async ({ page }) => {
  test.setTimeout(90_000);
  const shop = await createTestShop({ roles: ['owner', 'mechanic', 'buyer'] });
  const shopId = shop.shop.id;
  const owner = userWithRole(shop, 'owner');
  const buyer = userWithRole(shop, 'buyer');
  const mechanic = userWithRole(shop, 'mechanic');
  await signIn(page.request, owner.email, shop.password);
  const old = await addPart(page.request, shopId, { number: 'SJ-4410', description: 'Footrest hanger with rubber', status: 'nla' });
  const current = await addPart(page.request, shopId, { number: 'SJ-4411', description: 'Footrest hanger' });
  await replacedBy(page.request, shopId, old, current);
  await addBin(page.request, shopId, 'B-04', 'Aisle B, shelf 4');

  // The buyer receives three hangers at 12.50 each, with the keyboard.
  await signIn(page.request, buyer.email, shop.password);
  await page.goto(`/shops/${shopId}/stock`);
  await expect(page.getByRole('heading', { level: 1, name: 'Stock' })).toBeVisible();
  await page.getByRole('button', { name: 'Receive stock' }).click();
  const receiveDialog = page.getByRole('dialog', { name: 'Receive stock' });
  await receiveDialog.getByLabel('Part number').fill('sj 4411');
  await receiveDialog.getByLabel('Bin').selectOption({ label: 'B-04 — Aisle B, shelf 4' });
  await receiveDialog.getByLabel('Quantity').fill('3');
  // A mistake first: no cost. The form says what to fix and keeps what was typed.
  await receiveDialog.getByRole('button', { name: 'Receive' }).click();
  await expect(receiveDialog.getByText('Enter the unit cost.')).toBeVisible();
  await expect(receiveDialog.getByLabel('Quantity')).toHaveValue('3');
  await receiveDialog.getByLabel('Unit cost (GBP)').fill('12.50');
  await receiveDialog.getByLabel('Reference').press('Enter');
  await expect(receiveDialog).toBeHidden();
  const row = page.getByRole('row', { name: /SJ-4411/ });
  await expect(row).toContainText('B-04');
  await expect(row.getByRole('cell').nth(4)).toHaveText('3'); // free (part, bin, on hand, held, free)

  await page.goto(`/shops/${shopId}/stock/value`);
  await expect(page.getByTestId('stock-value-total')).toHaveText('£37.50');

  // The mechanic looks up the old number and sees where its replacement sits.
  await signIn(page.request, mechanic.email, shop.password);
  await page.goto(`/shops/${shopId}/lookup`);
  await expect(page.getByRole('combobox', { name: 'Look up a part' })).toBeFocused();
  await page.keyboard.type('SJ 4410');
  const results = page.getByRole('listbox', { name: 'Lookup results' });
  await expect(results.getByRole('option').first()).toContainText('None in stock');
  const replacement = results.getByRole('option').filter({ hasText: 'SJ-4411' });
  await expect(replacement).toContainText('replaces SJ-4410');
  await expect(replacement).toContainText('3 free in B-04 (new)');
  await replacement.click();
  await expect(page).toHaveURL(new RegExp(`/catalogue/${current.id}$`));
  // Under the number, a line with the stock and the sell price, and a way down to the stock panel.
  const glance = page.getByTestId('part-glance');
  await expect(glance).toContainText('Stock: 3 free in B-04');
  await expect(glance).toContainText(/Sell price: (£[\d,.]+ before tax|none set)/);
  await glance.getByRole('link', { name: 'Stock and actions' }).click();
  await expect(page).toHaveURL(/#part-stock-heading$/);
  await expect(page.getByRole('heading', { level: 2, name: 'Stock' })).toBeInViewport();

  // Hold two for a job, then issue them from the hold. The part's stock answer carries its holds:
  // the page asks for no list of the shop's holds, nor for the whole valuation.
  const wholeShopReads: string[] = [];
  page.on('request', (request) => {
    if (request.method() === 'GET' && /\/stock\/(holds|valuation)$/.test(new URL(request.url()).pathname)) wholeShopReads.push(request.url());
  });
  const summary = page.getByTestId('part-stock-summary');
  await expect(summary).toHaveText('On hand 3 · held 0 · free 3');
  await page.getByRole('button', { name: 'Hold SJ-4411 from B-04, new' }).click();
  const holdDialog = page.getByRole('dialog', { name: 'Hold stock' });
  await holdDialog.getByLabel('Quantity').fill('2');
  await holdDialog.getByLabel('Held for').fill('Recommissioning, green single');
  await holdDialog.getByRole('button', { name: 'Hold' }).click();
  await expect(holdDialog).toBeHidden();
  await expect(summary).toHaveText('On hand 3 · held 2 · free 1');

  await page.getByRole('button', { name: 'Issue SJ-4411 held for Recommissioning, green single' }).click();
  const issueDialog = page.getByRole('dialog', { name: 'Issue stock' });
  await expect(issueDialog).toContainText('held for Recommissioning, green single');
  await expect(issueDialog.getByLabel('Quantity')).toHaveValue('2');
  await issueDialog.getByLabel('Reference').fill('Job 212');
  await issueDialog.getByRole('button', { name: 'Issue' }).click();
  await expect(issueDialog).toBeHidden();
  await expect(summary).toHaveText('On hand 1 · held 0 · free 1');
  await expect(page.getByTestId('part-stock-value')).toContainText('£12.50');
  expect(wholeShopReads).toEqual([]);

  // The value report follows, and the ledger shows the issue against the job.
  await page.goto(`/shops/${shopId}/stock/value`);
  await expect(page.getByTestId('stock-value-total')).toHaveText('£12.50');
  await page.goto(`/shops/${shopId}/stock/movements`);
  const issued = page.getByRole('row', { name: /Issued/ });
  await expect(issued).toContainText('SJ-4411');
  await expect(issued).toContainText('Job 212');
  await expect(issued).toContainText('−£25.00');
});
