import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { addBin, addPart, receive, replacedBy, signIn } from './stock-api';

// axe-core against WCAG 2.x A and AA rules: no serious or critical violation on the stock screens,
// filled with data, with a dialog open and showing errors, in both themes and at tablet size.
async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

for (const scheme of ['light', 'dark'] as const) {
  test(`the stock screens (${scheme})`, async ({ page }) => {
    test.setTimeout(120_000);
    const shop = await createTestShop({ roles: ['owner'] });
    const shopId = shop.shop.id;
    await signIn(page.request, userWithRole(shop, 'owner').email, shop.password);
    const old = await addPart(page.request, shopId, { number: 'AX-100', description: 'Clutch cable, early', status: 'nla', category: 'Controls' });
    const part = await addPart(page.request, shopId, { number: 'AX-100A', description: 'Clutch cable', category: 'Controls' });
    await replacedBy(page.request, shopId, old, part);
    const bin = await addBin(page.request, shopId, 'A-01', 'Aisle A, shelf 1');
    await receive(page.request, shopId, { partId: part.id, binId: bin.id, condition: 'new', quantity: 5, unitCostMinor: 640 });
    await receive(page.request, shopId, { partId: part.id, binId: bin.id, condition: 'used_good', quantity: 1, unitCostMinor: 150_000, serials: ['ENG 1041'] });
    await page.emulateMedia({ colorScheme: scheme });

    for (const [path, heading] of [
      ['stock', 'Stock'],
      ['stock/movements', 'Stock movements'],
      ['stock/holds', 'Held stock'],
      ['stock/bins', 'Bins'],
      ['stock/value', 'Stock value'],
    ] as const) {
      await page.goto(`/shops/${shopId}/${path}`);
      await expect(page.getByRole('heading', { level: 1, name: heading })).toBeVisible();
      await expect(page.getByText(/Loading/)).toHaveCount(0);
      await expectNoSeriousViolations(page, `${heading} (${scheme})`);
    }

    await page.goto(`/shops/${shopId}/stock`);
    await page.getByRole('row', { name: /AX-100A.*New/ }).getByRole('button', { name: 'More' }).click();
    await page.getByRole('menuitem', { name: 'Adjust AX-100A from A-01' }).click();
    const dialog = page.getByRole('dialog', { name: 'Adjust stock' });
    await dialog.getByRole('button', { name: 'Adjust' }).click();
    await expect(dialog.getByText('Say why the stock is adjusted (at least 3 characters).')).toBeVisible();
    await expectNoSeriousViolations(page, `adjust dialog with errors (${scheme})`);
    await page.keyboard.press('Escape');

    await page.goto(`/shops/${shopId}/catalogue/${old.id}`);
    await expect(page.getByRole('heading', { name: 'Stock' })).toBeVisible();
    await expect(page.getByText('Other numbers that can fill a demand for AX-100')).toBeVisible();
    await expectNoSeriousViolations(page, `part page with stock (${scheme})`);
  });
}
