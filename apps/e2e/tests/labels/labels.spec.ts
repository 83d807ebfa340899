import fs from 'node:fs/promises';
import { expect, test } from '@playwright/test';
import { PDFDocument } from 'pdf-lib';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { addPart, signInThroughApi } from '../catalogue/catalogue-api';

test('a mechanic chooses parts across two pages of the catalogue and prints their labels as a PDF', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner', 'mechanic'] });
  const shopId = shop.shop.id;
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  // 26 parts: one more than a page of the list, two more than an A4 sheet.
  for (let i = 0; i < 26; i += 1) {
    await addPart(page.request, shopId, { number: `LB-${String(100 + i)}`, description: `Label test part ${i}, rocker cover gasket`, category: 'Engine' });
  }
  await signInThroughApi(page.request, userWithRole(shop, 'mechanic').email, shop.password);

  await page.goto(`/shops/${shopId}/catalogue`);
  const table = page.getByRole('table', { name: 'Parts in the catalogue' });
  await expect(table).toBeVisible();
  await table.getByRole('checkbox', { name: 'Choose every part on this page' }).check();
  await expect(page.getByRole('region', { name: 'Chosen parts' })).toContainText('25 parts chosen');
  await page.getByRole('button', { name: 'Next page' }).click();
  await expect(page.getByText('Parts 26–26 of 26')).toBeVisible();
  await table.getByRole('checkbox', { name: /^Choose LB-/ }).check();
  const bar = page.getByRole('region', { name: 'Chosen parts' });
  await expect(bar).toContainText('26 parts chosen');

  await bar.getByRole('button', { name: 'Print labels' }).click();
  const dialog = page.getByRole('dialog', { name: 'Print part labels' });
  // The shop's format (A4 until the owner changes it) is preselected.
  await expect(dialog.getByLabel('Label format')).toHaveValue('a4-3x8');
  await expect(dialog.getByText('26 labels on 2 A4 sheets')).toBeVisible();
  await dialog.getByRole('button', { name: 'Make the PDF' }).click();
  await expect(dialog.getByText('The labels are ready.')).toBeVisible();
  await expect(dialog.getByText(/26 labels on 2 A4 sheets/)).toBeVisible();

  const [download] = await Promise.all([page.waitForEvent('download'), dialog.getByRole('link', { name: 'Download' }).click()]);
  expect(download.suggestedFilename()).toBe('part-labels-a4-3x8.pdf');
  const pdf = await PDFDocument.load(await fs.readFile((await download.path())!));
  expect(pdf.getPageCount()).toBe(2);
  for (const p of pdf.getPages()) {
    expect(p.getWidth()).toBeCloseTo(595.28, 1);
    expect(p.getHeight()).toBeCloseTo(841.89, 1);
  }
  await page.screenshot({ path: '/tmp/labels-dialog-ready.png' });
  await dialog.getByRole('button', { name: 'Done' }).click();
  await expect(dialog).toBeHidden();
});

test('a single part prints from its page on the roll printer, chosen for this print only', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  const part = await addPart(page.request, shopId, { number: 'LB-900', description: 'Float needle and seat', category: 'Fuel' });
  await page.goto(`/shops/${shopId}/catalogue/${part.id}`);
  await page.getByRole('button', { name: 'Print label' }).click();
  const dialog = page.getByRole('dialog', { name: 'Print part labels' });
  await dialog.getByLabel('Label format').selectOption('roll-62x29');
  await expect(dialog.getByLabel('Start at label position')).toHaveCount(0);
  await dialog.getByLabel('Copies of each label').fill('3');
  await expect(dialog.getByText('3 labels for the roll printer, one a page')).toBeVisible();
  await dialog.getByRole('button', { name: 'Make the PDF' }).click();
  const [download] = await Promise.all([page.waitForEvent('download'), dialog.getByRole('link', { name: 'Download' }).click()]);
  const pdf = await PDFDocument.load(await fs.readFile((await download.path())!));
  expect(pdf.getPages().map((p) => [Math.round(p.getWidth() * 100) / 100, Math.round(p.getHeight() * 100) / 100])).toEqual([
    [175.75, 82.2],
    [175.75, 82.2],
    [175.75, 82.2],
  ]);
});
