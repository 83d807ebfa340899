import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { signInThroughApi } from './catalogue-api';

const csv = (name: string, text: string) => ({ name, mimeType: 'text/csv', buffer: Buffer.from(text, 'utf8') });

test('the buyer imports a parts file: sees its errors, fixes it, imports it and finds the part', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner', 'buyer'] });
  const shopId = shop.shop.id;
  await signInThroughApi(page.request, userWithRole(shop, 'buyer').email, shop.password);
  await page.goto(`/shops/${shopId}/catalogue`);
  await expect(page.getByText('The catalogue is empty')).toBeVisible();
  await page.getByRole('link', { name: 'Import', exact: true }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Import into the catalogue' })).toBeVisible();

  await page.getByRole('radio', { name: 'Parts' }).check();
  // Row 3 has no description; row 4 an origin nobody knows. Leading zeros must survive.
  const bad = 'number;description;origin;category\n07-2201;Fork seal;genuine;Forks\n07-2202;;genuine;Forks\n007-2203;Fork bush;secondhand;Forks\n';
  await page.getByLabel('CSV file').setInputFiles(csv('forks.csv', bad));
  await page.getByRole('button', { name: 'Check file' }).click();

  const errors = page.getByRole('table', { name: /in the file/ });
  await expect(errors).toBeVisible();
  await expect(errors.getByRole('row').filter({ hasText: 'description' }).getByRole('cell').first()).toHaveText('3');
  await expect(errors.getByRole('row').filter({ hasText: 'origin' }).getByRole('cell').first()).toHaveText('4');
  await expect(page.getByRole('button', { name: 'Import', exact: true })).toBeDisabled();

  const good = 'number;description;origin;category\n07-2201;Fork seal;genuine;Forks\n07-2202;Fork seal, lower;genuine;Forks\n007-2203;Fork bush;reproduction;Forks\n';
  await page.getByLabel('CSV file').setInputFiles(csv('forks-fixed.csv', good));
  await page.getByRole('button', { name: 'Check file' }).click();
  await expect(page.getByRole('table', { name: /in the file/ })).toHaveCount(0);
  await page.getByRole('button', { name: 'Import 3 rows' }).click();
  await expect(page.getByText(/3 rows imported: 3 added/)).toBeVisible();

  await page.getByRole('link', { name: 'Open the catalogue' }).click();
  await page.getByRole('searchbox', { name: 'Number or description' }).fill('007-2203');
  await page.keyboard.press('Enter');
  const table = page.getByRole('table', { name: 'Parts in the catalogue' });
  await expect(table.getByRole('row')).toHaveCount(2);
  await expect(table.getByRole('row').nth(1)).toContainText('007-2203');
  await expect(table.getByRole('row').nth(1)).toContainText('Reproduction');
});
