import { expect, test, type Response } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { postJson, seedReorderWorld, signInThroughApi } from './purchasing-api';

test('an order written by hand, its draft lines changed, and the part page showing how it is bought', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  const world = await seedReorderWorld(page.request, shopId, `orders-${shopId.slice(0, 8)}@marrick-spares.test`);
  await postJson(page.request, `/api/shops/${shopId}/parts`, { number: 'GS-207', description: 'Gasket set, top end' });

  await page.setViewportSize({ width: 820, height: 1180 });
  // Purchasing has no page of its own: its address opens the reorder list.
  await page.goto(`/shops/${shopId}/purchasing`);
  await expect(page.getByRole('heading', { level: 1, name: 'Reorder list' })).toBeVisible();

  // Write a draft by hand on the supplier's page: a listed part at its listed price.
  await page.goto(`/shops/${shopId}/purchasing/suppliers/${world.supplierId}`);
  await page.getByRole('button', { name: 'Write an order' }).click();
  const write = page.getByRole('dialog', { name: 'Write an order to Marrick Spares' });
  await write.getByLabel('Part number, line 1').fill('CR-4411');
  await write.getByLabel('Quantity, line 1').fill('6');
  await write.getByRole('button', { name: 'Write draft' }).click();
  await expect(page.getByRole('heading', { level: 1, name: /Purchase order PO-\d{6}/ })).toBeVisible();
  const orderId = page.url().split('/').at(-1)!;
  await expect(page.getByRole('table', { name: /Lines of PO-/ })).toContainText('£30.00');

  // Change it: 12 at £4.80, and a line for a part the supplier does not list (its price is needed).
  await page.getByRole('button', { name: 'Change lines…' }).click();
  const change = page.getByRole('dialog', { name: /Change PO-\d{6}/ });
  await change.getByLabel('Quantity, line 1').fill('12');
  await change.getByLabel('Unit price (GBP), line 1').fill('4.80');
  await change.getByRole('button', { name: 'Add a line' }).click();
  await change.getByLabel('Part number, line 2').fill('GS-207');
  await change.getByLabel('Quantity, line 2').fill('2');
  await change.getByRole('button', { name: 'Save lines' }).click();
  await expect(change.getByText('Marrick Spares does not list this part: enter its price.')).toBeVisible();
  await change.getByLabel('Unit price (GBP), line 2').fill('11.25');
  await change.getByLabel('Core deposit a unit (GBP), line 2').fill('5.00');
  await page.screenshot({ path: '/tmp/purchasing-edit-lines.png', fullPage: true });
  await change.getByRole('button', { name: 'Save lines' }).click();
  await expect(change).toBeHidden();
  // 12 × 4.80 + 2 × (11.25 + 5.00) = 57.60 + 32.50 = 90.10
  await expect(page.getByRole('table', { name: /Lines of PO-/ })).toContainText('£90.10');
  let order = await (await page.request.get(`/api/shops/${shopId}/purchasing/orders/${orderId}`)).json();
  expect(order.lines.map((l: { partNumber: string; quantity: number; unitPriceMinor: number; coreDepositMinor: number }) => [l.partNumber, l.quantity, l.unitPriceMinor, l.coreDepositMinor])).toEqual([
    ['CR-4411', 12, 480, 0],
    ['GS-207', 2, 1125, 500],
  ]);

  // Remove the first line again.
  await page.getByRole('button', { name: 'Change lines…' }).click();
  await change.getByRole('button', { name: 'Remove line 1' }).click();
  await change.getByRole('button', { name: 'Save lines' }).click();
  await expect(change).toBeHidden();
  await expect(page.getByRole('table', { name: /Lines of PO-/ })).toContainText('£32.50');
  order = await (await page.request.get(`/api/shops/${shopId}/purchasing/orders/${orderId}`)).json();
  expect(order.lines).toHaveLength(1);
  expect(order.totalMinor).toBe(3250);

  // The part page says who it is bought from, and takes a minimum and maximum set by hand. Its
  // first load brings no zod: its panels check their answers by hand, and the form's rules load
  // when the form is sent (docs/decisions/029-part-panels-without-zod.md).
  const scripts: Array<Promise<{ url: string; code: string }>> = [];
  const onScript = (r: Response) => {
    if (new URL(r.url()).pathname.endsWith('.js')) scripts.push(r.text().then((code) => ({ url: r.url(), code })));
  };
  page.on('response', onScript);
  await page.goto(`/shops/${shopId}/catalogue/${world.newPartId}`);
  const panel = page.getByRole('region', { name: 'Buying this part' });
  await expect(panel).toContainText('Not bought yet');
  await expect(page.getByTestId('part-stock-summary')).toHaveText('On hand 0 · held 0 · free 0');
  await expect(page.getByRole('region', { name: 'Sell price' })).not.toContainText('Loading');
  page.off('response', onScript);
  const loaded = await Promise.all(scripts);
  expect(loaded.length).toBeGreaterThan(5);
  expect(loaded.filter((s) => s.code.includes('$ZodObject')).map((s) => s.url)).toEqual([]);
  await panel.getByRole('button', { name: 'Change buying choices' }).click();
  await panel.getByLabel('Preferred supplier').selectOption({ label: 'Marrick Spares (£5.00)' });
  await panel.getByLabel('Minimum on hand').fill('8');
  await panel.getByLabel('Maximum on hand').fill('4');
  await panel.getByRole('button', { name: 'Save choices' }).click();
  await expect(panel.getByText('The minimum cannot be above the maximum.')).toBeVisible();
  await panel.getByLabel('Maximum on hand').fill('24');
  await panel.getByRole('button', { name: 'Save choices' }).click();
  await expect(panel).toContainText('8 / 24 (set by hand)');
  await expect(panel).toContainText('Preferred supplierMarrick Spares');
  await page.screenshot({ path: '/tmp/purchasing-part-panel.png', fullPage: true });
});
