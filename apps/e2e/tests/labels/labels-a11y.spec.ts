import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { addPart, signInThroughApi } from '../catalogue/catalogue-api';

// axe-core against WCAG 2.x A and AA rules: the print dialog (form, errors, file ready) and the
// camera scanner (here without camera permission: the refusal and the typing fallback).
async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

test('the label and scanning dialogs, in light and dark themes', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  await addPart(page.request, shopId, { number: 'AX-100', description: 'Brake shoe pair', category: 'Brakes' });
  await addPart(page.request, shopId, { number: 'AX-101', description: 'Brake cam lever', category: 'Brakes' });

  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    await page.goto(`/shops/${shopId}/catalogue`);
    const table = page.getByRole('table', { name: 'Parts in the catalogue' });
    await table.getByRole('checkbox', { name: 'Choose AX-100' }).check();
    await expectNoSeriousViolations(page, `catalogue with a choice (${scheme})`);
    await page.getByRole('button', { name: 'Print labels' }).click();
    const dialog = page.getByRole('dialog', { name: 'Print part labels' });
    await expect(dialog.getByLabel('Label format')).toBeVisible();
    await expectNoSeriousViolations(page, `print dialog (${scheme})`);
    await dialog.getByLabel('Copies of each label').fill('0');
    await dialog.getByRole('button', { name: 'Make the PDF' }).click();
    await expect(dialog.getByText('Use a whole number from 1 to 50.')).toBeVisible();
    await expectNoSeriousViolations(page, `print dialog with an error (${scheme})`);
    await dialog.getByLabel('Copies of each label').fill('1');
    await dialog.getByRole('button', { name: 'Make the PDF' }).click();
    await expect(dialog.getByText('The labels are ready.')).toBeVisible();
    await expectNoSeriousViolations(page, `print dialog, file ready (${scheme})`);
    if (scheme === 'light') await page.screenshot({ path: '/tmp/labels-ready.png' });
    await dialog.getByRole('button', { name: 'Done' }).click();

    await page.goto(`/shops/${shopId}/lookup`);
    await page.getByRole('button', { name: 'Scan with the camera' }).click();
    const scanner = page.getByRole('dialog', { name: 'Scan a part number' });
    // No camera permission in this browser context: the dialog says so and offers typing.
    await expect(scanner.getByRole('alert')).toBeVisible();
    await expect(scanner.getByLabel('Or type the number')).toBeFocused();
    await expectNoSeriousViolations(page, `camera scanner without a camera (${scheme})`);
    if (scheme === 'light') await page.screenshot({ path: '/tmp/scanner-refused.png' });
    await scanner.getByLabel('Or type the number').fill('AX-100');
    await page.keyboard.press('Enter');
    await expect(page).toHaveURL(new RegExp(`/shops/${shopId}/catalogue/`));
  }
});
