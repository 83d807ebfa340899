import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { waitForMail } from '../../fixtures/stack';
import { seedReorderWorld, signInThroughApi } from './purchasing-api';

test('from the reorder list to a sent order to a partial receipt, with stock and valuation following', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  const supplierEmail = `orders-${shopId.slice(0, 8)}@marrick-spares.test`;
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  const world = await seedReorderWorld(page.request, shopId, supplierEmail);
  const valueBefore = (await (await page.request.get(`/api/shops/${shopId}/stock/valuation`)).json()).totalMinor as number;

  await page.setViewportSize({ width: 1280, height: 800 });
  await page.goto(`/shops/${shopId}/purchasing/reorder`);
  await expect(page.getByRole('heading', { level: 1, name: 'Reorder list' })).toBeVisible();
  await expect(page.getByRole('heading', { name: 'Marrick Spares' })).toBeVisible();

  // The suggestion explains itself: the older number that fed it, and the chart.
  await page.getByRole('button', { name: 'Explain CR-4411' }).click();
  await expect(page.getByText('Demand includes issues under CR-4410, which resolve to CR-4411.')).toBeVisible();
  await expect(page.getByRole('img', { name: /Demand per week for CR-4411/ })).toBeVisible();
  await page.screenshot({ path: '/tmp/purchasing-reorder.png', fullPage: true });

  await page.getByRole('checkbox', { name: 'Order CR-4411' }).check();
  await page.getByRole('button', { name: 'Draft orders for 1 selected' }).click();
  await expect(page.getByRole('heading', { level: 1, name: /Purchase order PO-\d{6}/ })).toBeVisible();
  await expect(page.getByText('Draft', { exact: true })).toBeVisible();
  const orderId = page.url().split('/').at(-1)!;
  const order = await (await page.request.get(`/api/shops/${shopId}/purchasing/orders/${orderId}`)).json();
  const ordered = order.lines[0].quantity as number;
  expect(ordered % 6).toBe(0);

  await page.getByRole('button', { name: 'Send to supplier' }).click();
  await page.getByRole('alertdialog').getByRole('button', { name: 'Send order' }).click();
  await expect(page.getByText('Sent', { exact: true })).toBeVisible();
  const mail = await waitForMail(supplierEmail, new RegExp(`Purchase order ${order.reference}`));
  expect(mail.text).toContain(order.reference);

  // Six arrive now; the rest stays on back-order.
  await page.getByRole('button', { name: 'Receive goods…' }).click();
  const dialog = page.getByRole('dialog', { name: `Receive against ${order.reference}` });
  // A keyboard-wedge scanner types the supplier's number and Enter: the line is picked, nothing is submitted.
  await dialog.getByLabel('Scan or type a part number').pressSequentially('MARRICK 411');
  await dialog.getByLabel('Scan or type a part number').press('Enter');
  await expect(dialog.getByLabel('Quantity of CR-4411 received')).toBeFocused();
  await page.screenshot({ path: '/tmp/purchasing-receive.png' });
  await page.keyboard.type('6');
  await dialog.getByLabel('Bin for CR-4411').selectOption({ label: 'C-07' });
  await dialog.getByRole('button', { name: 'Receive' }).click();
  await expect(page.getByText('Partly received', { exact: true })).toBeVisible();
  await expect(page.getByText(/6 × CR-4411 into bin C-07 at £5\.00 each/)).toBeVisible();
  await page.screenshot({ path: '/tmp/purchasing-order.png', fullPage: true });

  // Labels for what arrived: one for each of the six units, each naming the bin it went to.
  await page.getByRole('button', { name: 'Print labels for what arrived' }).click();
  const labels = page.getByRole('dialog', { name: 'Print labels for what arrived' });
  await expect(labels.getByText('CR-4411')).toBeVisible();
  await expect(labels.getByText(/^6 labels on 1 /)).toBeVisible();
  const made = page.waitForResponse((r) => r.url().endsWith('/labels/receipts') && r.request().method() === 'POST');
  await labels.getByRole('button', { name: 'Make the PDF' }).click();
  const pdf = await made;
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()['content-type']).toContain('application/pdf');
  expect(pdf.headers()['x-label-count']).toBe('6');
  await expect(labels.getByText('The labels are ready.')).toBeVisible();
  await labels.getByRole('button', { name: 'Done' }).click();

  const stock = await (await page.request.get(`/api/shops/${shopId}/stock/parts/${world.newPartId}`)).json();
  expect(JSON.stringify(stock)).toContain('"onHand":6');
  const valueAfter = (await (await page.request.get(`/api/shops/${shopId}/stock/valuation`)).json()).totalMinor as number;
  expect(valueAfter - valueBefore).toBe(3000);

  // One of them was faulty: it goes back to the supplier, and stock follows.
  await page.getByRole('button', { name: 'Return CR-4411' }).click();
  const back = page.getByRole('dialog', { name: 'Return CR-4411 to Marrick Spares' });
  await back.getByLabel('Reason').fill('Friction material flaking');
  await back.getByRole('button', { name: 'Record return' }).click();
  await expect(page.getByText('Return recorded: £5.00 to be credited.')).toBeVisible();
  const afterReturn = (await (await page.request.get(`/api/shops/${shopId}/stock/valuation`)).json()).totalMinor as number;
  expect(afterReturn - valueBefore).toBe(2500);

  // The tablet layout in portrait keeps the order readable.
  await page.setViewportSize({ width: 820, height: 1180 });
  await page.reload();
  await expect(page.getByRole('button', { name: 'Receive goods…' })).toBeVisible();
  await page.screenshot({ path: '/tmp/purchasing-order-tablet.png', fullPage: true });
});
