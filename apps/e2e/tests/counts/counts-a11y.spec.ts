import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { writeHeaders } from '../../fixtures/stack';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { addBin, addPart, receive, signIn } from '../stock/stock-api';

// axe-core against WCAG 2.x A and AA rules on the count screens: the list, the start dialog, the
// counting screen (with stock found and a validation error) and the differences with the post
// confirmation, in both themes at tablet size.
async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

test.use({ viewport: { width: 820, height: 1180 } });

for (const scheme of ['light', 'dark'] as const) {
  test(`the count screens (${scheme})`, async ({ page }) => {
    test.setTimeout(120_000);
    const shop = await createTestShop({ roles: ['owner'] });
    const shopId = shop.shop.id;
    await signIn(page.request, userWithRole(shop, 'owner').email, shop.password);
    const part = await addPart(page.request, shopId, { number: 'FB-12', description: 'Fan belt', category: 'Cooling' });
    const other = await addPart(page.request, shopId, { number: 'TS-3', description: 'Thermostat, 82 °C', category: 'Cooling' });
    const bin = await addBin(page.request, shopId, 'D-02', 'Drawer 2');
    await receive(page.request, shopId, { partId: part.id, binId: bin.id, condition: 'new', quantity: 4, unitCostMinor: 800 });
    await receive(page.request, shopId, { partId: other.id, binId: bin.id, condition: 'used_good', quantity: 2, unitCostMinor: 1500 });
    const started = await page.request.post(`/api/shops/${shopId}/counts`, { headers: writeHeaders, data: { binIds: [bin.id], note: 'Drawer check' } });
    const count = await started.json();
    await page.request.post(`/api/shops/${shopId}/counts/${count.id}/entries`, { headers: writeHeaders, data: { lineId: count.lines[0].id, quantity: 3 } });
    await page.emulateMedia({ colorScheme: scheme });

    await page.goto(`/shops/${shopId}/counts`);
    await expect(page.getByRole('heading', { level: 1, name: 'Stock counts' })).toBeVisible();
    await expect(page.getByText(/Loading/)).toHaveCount(0);
    await expectNoSeriousViolations(page, `counts list (${scheme})`);
    await page.getByRole('button', { name: 'Start a count' }).click();
    await page.getByRole('dialog', { name: 'Start a count' }).getByRole('button', { name: 'Start the count' }).click();
    await expect(page.getByText('Choose at least one bin to count.')).toBeVisible();
    await expectNoSeriousViolations(page, `start dialog with an error (${scheme})`);
    await page.keyboard.press('Escape');

    await page.goto(`/shops/${shopId}/counts/${count.id}`);
    await expect(page.getByRole('heading', { level: 1, name: 'Count 1' })).toBeVisible();
    await expect(page.getByText(/Loading/)).toHaveCount(0);
    // A supplier barcode no part has yet: offered to attach, then it picks the part's line.
    const scan = page.getByRole('textbox', { name: 'Scan or type a part number' });
    await scan.fill('6291041500213');
    await scan.press('Enter');
    const attach = page.getByRole('form', { name: 'Attach a barcode to a part' });
    await attach.getByRole('textbox', { name: 'Part number' }).fill('FB-12');
    await expectNoSeriousViolations(page, `attach a barcode (${scheme})`);
    await attach.getByRole('button', { name: 'Attach the barcode' }).click();
    await expect(page.getByText('Barcode 6291041500213 attached to FB-12.')).toBeVisible();
    await expect(page.getByRole('textbox', { name: 'Counted FB-12, new' })).toBeFocused();
    // Scanned again, it goes straight to the line; a wrong check digit is refused.
    await scan.fill('6291041500213');
    await scan.press('Enter');
    await expect(page.getByRole('textbox', { name: 'Counted FB-12, new' })).toBeFocused();
    await scan.fill('6291041500214');
    await scan.press('Enter');
    await expect(page.getByText(/its last digit should be 3/)).toBeVisible();

    await page.getByRole('textbox', { name: 'Counted TS-3, used, good' }).fill('two');
    await page.getByRole('button', { name: 'Save count of TS-3, used, good' }).click();
    await expect(page.getByText('Enter a whole number, 0 or more.')).toBeVisible();
    await expectNoSeriousViolations(page, `counting screen (${scheme})`);
    await page.screenshot({ path: test.info().outputPath(`count-screen-${scheme}.png`), fullPage: true });

    await page.goto(`/shops/${shopId}/counts/${count.id}/differences`);
    await expect(page.getByRole('heading', { level: 1, name: 'Count 1: differences' })).toBeVisible();
    await expect(page.getByText(/Loading/)).toHaveCount(0);
    await expectNoSeriousViolations(page, `differences (${scheme})`);
    await page.getByRole('button', { name: 'Post the count' }).click();
    await expect(page.getByRole('alertdialog', { name: 'Post this count?' })).toBeVisible();
    await expectNoSeriousViolations(page, `post confirmation (${scheme})`);
  });
}
