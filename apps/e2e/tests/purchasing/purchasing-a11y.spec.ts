import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { postJson, seedReorderWorld, signInThroughApi } from './purchasing-api';

// axe-core against WCAG 2.x A and AA rules: no serious or critical violation on the purchasing screens with data.
async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

test('the purchasing screens with data, in light and dark themes', async ({ page }) => {
  test.setTimeout(240_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  const world = await seedReorderWorld(page.request, shopId, `orders-${shopId.slice(0, 8)}@marrick-spares.test`);
  const order = await postJson<{ id: string }>(page.request, `/api/shops/${shopId}/purchasing/orders`, { supplierId: world.supplierId, lines: [{ partId: world.newPartId, quantity: 6, coreDepositMinor: 250 }] });
  await postJson(page.request, `/api/shops/${shopId}/purchasing/returns`, { supplierId: world.supplierId, partId: world.oldPartId, binId: world.binId, quantity: 1, reason: 'Friction material flaking', expectedCreditMinor: 450 });

  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    await page.goto(`/shops/${shopId}/purchasing/reorder`);
    await page.getByRole('button', { name: 'Explain CR-4411' }).click();
    await expect(page.getByRole('img', { name: /Demand per week/ })).toBeVisible();
    await expectNoSeriousViolations(page, `reorder list with an explanation (${scheme})`);

    await page.goto(`/shops/${shopId}/purchasing/orders/${order.id}`);
    await expect(page.getByRole('table', { name: /Lines of PO-/ })).toBeVisible();
    await expectNoSeriousViolations(page, `order page (${scheme})`);
    await page.getByRole('button', { name: 'Cancel order…' }).click();
    await page.getByRole('dialog', { name: 'Cancel this order' }).getByRole('button', { name: 'Cancel order' }).click();
    await expect(page.getByText('Give a reason (at least 3 characters).')).toBeVisible();
    await expectNoSeriousViolations(page, `cancel dialog with an error (${scheme})`);
    await page.keyboard.press('Escape');

    await page.goto(`/shops/${shopId}/purchasing/orders`);
    await expect(page.getByRole('table', { name: 'Purchase orders' })).toBeVisible();
    await expectNoSeriousViolations(page, `orders (${scheme})`);

    await page.goto(`/shops/${shopId}/purchasing/suppliers`);
    await expect(page.getByRole('table', { name: 'Suppliers' })).toBeVisible();
    await page.getByRole('button', { name: 'Add a supplier' }).click();
    await page.getByRole('dialog', { name: 'Add a supplier' }).getByRole('button', { name: 'Add supplier' }).click();
    await expectNoSeriousViolations(page, `add supplier with errors (${scheme})`);
    await page.keyboard.press('Escape');

    await page.goto(`/shops/${shopId}/purchasing/suppliers/${world.supplierId}`);
    await expect(page.getByRole('table', { name: 'Listings of Marrick Spares' })).toBeVisible();
    await page.getByRole('button', { name: 'Add a listing' }).click();
    await page.getByRole('dialog', { name: 'Add a listing to Marrick Spares' }).getByRole('button', { name: 'Add listing' }).click();
    await expect(page.getByText('Enter the part number.')).toBeVisible();
    await expectNoSeriousViolations(page, `supplier page, add listing with errors (${scheme})`);
    await page.keyboard.press('Escape');

    await page.goto(`/shops/${shopId}/purchasing/orders/${order.id}`);
    await page.getByRole('button', { name: 'Change lines…' }).click();
    const change = page.getByRole('dialog', { name: /Change PO-\d{6}/ });
    await change.getByLabel('Quantity, line 1').fill('0');
    await change.getByRole('button', { name: 'Save lines' }).click();
    await expect(change.getByText('Order a whole number, at least 1.')).toBeVisible();
    await expectNoSeriousViolations(page, `change order lines with an error (${scheme})`);
    await page.keyboard.press('Escape');

    await page.goto(`/shops/${shopId}/catalogue/${world.newPartId}`);
    await page.getByRole('region', { name: 'Buying this part' }).getByRole('button', { name: 'Change buying choices' }).click();
    await expect(page.getByLabel('Minimum on hand')).toBeVisible();
    await expectNoSeriousViolations(page, `part page, buying choices (${scheme})`);

    await page.goto(`/shops/${shopId}/purchasing/returns`);
    await expect(page.getByRole('table', { name: 'Returns and cores' })).toBeVisible();
    await expectNoSeriousViolations(page, `returns (${scheme})`);
  }
  await page.emulateMedia({ colorScheme: 'light' });
  await page.goto(`/shops/${shopId}/purchasing/suppliers`);
  await page.screenshot({ path: '/tmp/purchasing-suppliers.png', fullPage: true });
});
