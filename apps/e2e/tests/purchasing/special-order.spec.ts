import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { postJson, signInThroughApi } from './purchasing-api';

test('a job’s special order: on the reorder list, ordered, and held for the job when it arrives', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  const base = `/api/shops/${shopId}`;
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  const vehicle = await postJson<{ id: string }>(page.request, `${base}/vehicles`, { kind: 'shop_stock', marque: 'Velmark', model: 'Plover', year: 1972, frameNumber: 'VP 2211' });
  const job = await postJson<{ id: string; number: number }>(page.request, `${base}/jobs`, { vehicleId: vehicle.id, title: 'Front calipers', customerRequest: '' });
  const part = await postJson<{ id: string }>(page.request, `${base}/parts`, { number: 'CS-3318', description: 'Caliper seal kit' });
  await postJson(page.request, `${base}/stock/bins`, { code: 'S-02' });
  const supplier = await postJson<{ id: string }>(page.request, `${base}/purchasing/suppliers`, { name: 'Larchfield Seals', email: `seals-${shopId.slice(0, 8)}@larchfield.test`, currency: 'GBP', leadTimeDays: 5 });
  await postJson(page.request, `${base}/purchasing/suppliers/${supplier.id}/listings`, { partId: part.id, priceMinor: 1850, packSize: 2 });
  await postJson(page.request, `${base}/jobs/${job.id}/special-orders`, { partId: part.id, quantity: 1, note: 'Seized piston, nearside' });

  await page.setViewportSize({ width: 820, height: 1180 });
  await page.goto(`/shops/${shopId}/purchasing/reorder`);
  await expect(page.getByRole('heading', { name: 'Special orders for jobs' })).toBeVisible();
  await expect(page.getByRole('link', { name: `Job ${job.number}` })).toBeVisible();
  await page.screenshot({ path: '/tmp/purchasing-special-orders.png', fullPage: true });
  await page.getByRole('checkbox', { name: `Order CS-3318 for job ${job.number}` }).check();
  await page.getByRole('button', { name: 'Draft orders for 1 selected' }).click();
  await expect(page.getByRole('heading', { level: 1, name: /Purchase order PO-\d{6}/ })).toBeVisible();
  await expect(page.getByText(`Special order for job ${job.number}`)).toBeVisible();

  await page.getByRole('button', { name: 'Send to supplier' }).click();
  await page.getByRole('alertdialog').getByRole('button', { name: 'Send order' }).click();
  await expect(page.getByText('Sent', { exact: true })).toBeVisible();
  await page.getByRole('button', { name: 'Receive goods…' }).click();
  // A pack of 2 arrives; the job asked for 1.
  await page.getByRole('dialog', { name: /Receive against/ }).getByRole('button', { name: 'Receive' }).click();
  await expect(page.getByText('Received', { exact: true }).first()).toBeVisible();

  const detail = await (await page.request.get(`${base}/jobs/${job.id}`)).json();
  expect(detail.specialOrders).toEqual([expect.objectContaining({ partId: part.id, status: 'received' })]);
  const stock = await (await page.request.get(`${base}/stock/parts/${part.id}`)).json();
  expect(stock.stock).toMatchObject({ onHand: 2, held: 1, free: 1 });
});
