import fs from 'node:fs';
import { expect, test } from '@playwright/test';
import { writeHeaders } from '../../fixtures/stack';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { addBin, addPart, receive, signIn } from '../stock/stock-api';

test.use({ viewport: { width: 820, height: 1180 } });

test('count one bin with a difference, post it, and print the bin’s labels', async ({ page }) => {
  test.setTimeout(90_000);
  const shop = await createTestShop({ roles: ['owner', 'mechanic'] });
  const shopId = shop.shop.id;
  await signIn(page.request, userWithRole(shop, 'owner').email, shop.password);
  const clamp = await addPart(page.request, shopId, { number: 'HC-210', description: 'Hose clamp, 16 mm', category: 'Cooling' });
  const cap = await addPart(page.request, shopId, { number: 'RC-4', description: 'Radiator cap, 7 psi', category: 'Cooling' });
  const bin = await addBin(page.request, shopId, 'C-07', 'Cooling, shelf 7');
  await receive(page.request, shopId, { partId: clamp.id, binId: bin.id, condition: 'new', quantity: 12, unitCostMinor: 95 });
  await receive(page.request, shopId, { partId: cap.id, binId: bin.id, condition: 'new', quantity: 3, unitCostMinor: 1250 });

  // The owner starts a count of the bin.
  await page.goto(`/shops/${shopId}/counts`);
  await expect(page.getByRole('heading', { level: 1, name: 'Stock counts' })).toBeVisible();
  await page.getByRole('button', { name: 'Start a count' }).click();
  const start = page.getByRole('dialog', { name: 'Start a count' });
  await start.getByRole('checkbox', { name: /C-07/ }).check();
  await start.getByRole('button', { name: 'Start the count' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Count 1' })).toBeVisible();
  await expect(page.getByText('0 of 2 lines counted')).toBeVisible();

  // A mechanic counts: a keyboard-wedge scanner types the code and Enter, which picks the line.
  await signIn(page.request, userWithRole(shop, 'mechanic').email, shop.password);
  await page.reload();
  const scan = page.getByRole('textbox', { name: 'Scan or type a part number' });
  await scan.click();
  await page.keyboard.type('HC-210', { delay: 5 });
  await page.keyboard.press('Enter');
  const clampField = page.getByRole('textbox', { name: 'Counted HC-210, new' });
  await expect(clampField).toBeFocused();
  await page.keyboard.type('11');
  await page.keyboard.press('Enter');
  await expect(page.getByText('HC-210: 11 counted.')).toBeVisible();
  await expect(scan).toBeFocused();
  // Typed by hand, in lower case: the same.
  await scan.fill('rc-4');
  await scan.press('Enter');
  await expect(page.getByRole('textbox', { name: 'Counted RC-4, new' })).toBeFocused();
  await page.keyboard.type('3');
  await page.keyboard.press('Enter');
  await expect(page.getByText('2 of 2 lines counted')).toBeVisible();
  await expect(page.getByText('1 with a difference')).toBeVisible();

  // Mechanics do not post: the owner does, after reading the differences.
  await signIn(page.request, userWithRole(shop, 'owner').email, shop.password);
  await page.goto(`/shops/${shopId}/counts`);
  await page.getByRole('link', { name: 'Count 1' }).click();
  await page.getByRole('link', { name: 'Review differences' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Count 1: differences' })).toBeVisible();
  const row = page.getByRole('row', { name: /HC-210/ });
  await expect(row.getByRole('cell').nth(4)).toContainText('−1');
  await page.screenshot({ path: test.info().outputPath('count-differences.png'), fullPage: true });
  await page.getByRole('button', { name: 'Post the count' }).click();
  const confirm = page.getByRole('alertdialog', { name: 'Post this count?' });
  await expect(confirm).toContainText('1 line changes');
  await confirm.getByRole('button', { name: 'Post the count' }).click();
  await expect(page.getByText('Count posted: stock now matches what was counted.')).toBeVisible();
  await expect(page.getByText('Posted', { exact: true })).toBeVisible();

  // The stock changed: 12 → 11, and the ledger names the count.
  const stock = await (await page.request.get(`/api/shops/${shopId}/stock/parts/${clamp.id}`)).json();
  expect(stock.stock.onHand).toBe(11);
  const moves = await (await page.request.get(`/api/shops/${shopId}/stock/movements?kind=counted`)).json();
  expect(moves.movements.map((m: { reference: string; quantityDelta: number }) => [m.reference, m.quantityDelta])).toContainEqual(['Stock count 1', -1]);

  // Labels for the count's bin: a PDF.
  await page.getByRole('link', { name: 'The count, line by line' }).click();
  await page.getByRole('button', { name: 'Print bin labels' }).click();
  const labels = page.getByRole('dialog', { name: 'Labels for this count’s bins' });
  const [response] = await Promise.all([page.waitForResponse((r) => r.url().includes('/labels/counts/')), labels.getByRole('button', { name: 'Make the labels' }).click()]);
  expect(response.status()).toBe(200);
  expect(response.headers()['content-type']).toBe('application/pdf');
  await expect(labels.getByText('1 label is ready.', { exact: false })).toBeVisible();
  const open = labels.getByRole('link', { name: 'Open the PDF' });
  await expect(open).toBeVisible();
  // The file the page offers is the PDF itself.
  const [download] = await Promise.all([page.waitForEvent('download'), labels.getByRole('link', { name: 'Download' }).click()]);
  expect(download.suggestedFilename()).toMatch(/^count-labels-.*\.pdf$/);
  expect(fs.readFileSync(await download.path()).subarray(0, 5).toString('latin1')).toBe('%PDF-');
  await page.screenshot({ path: test.info().outputPath('count-labels.png') });

  // The direct request too, for the bin and its parts.
  const pdf = await page.request.post(`/api/shops/${shopId}/labels/counts/${page.url().split('/').pop()}`, { headers: writeHeaders, data: { contents: true } });
  expect(pdf.headers()['x-label-count']).toBe('3');
});
