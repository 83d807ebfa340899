import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { postJson, seedReorderWorld, signInThroughApi } from './purchasing-api';

// A workshop tablet in landscape (1024 × 768, touch, overlay scroll bars): the purchasing lists
// fit without scrolling sideways, and no screen is wider than the tablet.
test.use({ viewport: { width: 1024, height: 768 }, isMobile: true, hasTouch: true });

/** How far `page` and each table's frame scroll sideways (0 when everything fits). */
async function sidewaysOverflow(page: Page) {
  return page.evaluate(() => ({
    page: document.documentElement.scrollWidth - document.documentElement.clientWidth,
    tables: [...document.querySelectorAll('table')].map((t) => {
      const frame = t.parentElement!;
      return { table: t.querySelector('caption')?.textContent ?? '', overflow: frame.scrollWidth - frame.clientWidth };
    }),
  }));
}

test('the purchasing screens fit a tablet in landscape', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  const world = await seedReorderWorld(page.request, shopId, `orders-${shopId.slice(0, 8)}@marrick-spares.test`);
  await postJson(page.request, `/api/shops/${shopId}/purchasing/returns`, { supplierId: world.supplierId, partId: world.oldPartId, binId: world.binId, quantity: 1, reason: 'Friction material flaking at one edge of the plate', expectedCreditMinor: 450 });

  for (const [path, table] of [
    ['suppliers', 'Suppliers'],
    [`suppliers/${world.supplierId}`, 'Listings of Marrick Spares'],
    ['returns', 'Returns and cores'],
  ] as const) {
    await page.goto(`/shops/${shopId}/purchasing/${path}`);
    await expect(page.getByRole('table', { name: table })).toBeVisible();
    expect(await sidewaysOverflow(page), path).toEqual({ page: 0, tables: [{ table, overflow: 0 }] });
  }
  // The listing's actions are one menu.
  await page.goto(`/shops/${shopId}/purchasing/suppliers/${world.supplierId}`);
  await page.getByRole('button', { name: /^Actions for the listing of / }).first().click();
  await expect(page.getByRole('menuitem', { name: 'Change the listing' })).toBeVisible();
  await page.getByRole('menuitem', { name: 'Change the listing' }).click();
  await expect(page.getByRole('dialog', { name: /Change the listing/ })).toBeVisible();
});
