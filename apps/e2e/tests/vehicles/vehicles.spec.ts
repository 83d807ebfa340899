import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import sharp from 'sharp';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { writeHeaders } from '../../fixtures/stack';

// A tiny valid PDF, enough for the API's content check.
const pdf = Buffer.from('%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n');

async function signIn(page: Page, email: string, password: string) {
  const res = await page.request.post('/api/auth/sign-in', { headers: writeHeaders, data: { email, password } });
  expect(res.status(), await res.text()).toBe(200);
}

async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

test('record a vehicle, add a photo and a PDF, and move it through the shop to handed over', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signIn(page, userWithRole(shop, 'owner').email, shop.password);
  await page.setViewportSize({ width: 1280, height: 800 });
  await page.goto(`/shops/${shopId}`);
  await page.getByRole('link', { name: 'Vehicles' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Vehicles' })).toBeVisible();
  await expect(page.getByText('No vehicles yet')).toBeVisible();

  await page.getByRole('button', { name: 'Record a vehicle' }).first().click();
  const dialog = page.getByRole('dialog', { name: 'Record a vehicle' });
  await dialog.getByLabel('Marque').fill('Corran');
  await dialog.getByLabel('Model').fill('Tern 350');
  await dialog.getByLabel('Year').fill('1967');
  await dialog.getByLabel('Frame number').fill('CT 41207');
  await dialog.getByLabel('Engine number').fill('CTE 41207');
  await dialog.getByLabel('Condition').selectOption('complete_project');
  await dialog.getByRole('button', { name: 'New customer…' }).click();
  await dialog.getByRole('group', { name: 'New customer' }).getByLabel('Name').fill('Edwin Halloway');
  await dialog.getByRole('button', { name: 'Add customer' }).click();
  await expect(dialog.getByLabel('Customer', { exact: true })).toHaveValue(/.+/);
  await dialog.getByLabel('Odometer').fill('18420');
  await dialog.getByRole('button', { name: 'Record vehicle' }).click();

  await expect(page.getByRole('heading', { level: 1, name: '1967 Corran Tern 350' })).toBeVisible();
  await expect(page.getByText('Edwin Halloway')).toBeVisible();

  // A photo and a PDF in one upload.
  const photo = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#2f6b4f' } }).jpeg().toBuffer();
  await page.getByLabel('Photos or PDFs').setInputFiles([
    { name: 'left-side.jpg', mimeType: 'image/jpeg', buffer: photo },
    { name: 'registration.pdf', mimeType: 'application/pdf', buffer: pdf },
  ]);
  await page.getByRole('button', { name: 'Upload' }).click();
  const gallery = page.getByRole('list', { name: 'Photo gallery' });
  const thumb = gallery.getByRole('img', { name: 'left-side.jpg' });
  await expect(thumb).toBeVisible();
  await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBeGreaterThan(0);
  await expect(page.getByRole('link', { name: 'registration.pdf' })).toBeVisible();

  // A script dressed as a photo is refused with a message, and nothing is added.
  await page.getByLabel('Photos or PDFs').setInputFiles([{ name: 'holiday.jpg', mimeType: 'image/jpeg', buffer: Buffer.from('#!/bin/sh\necho hi\n') }]);
  await page.getByRole('button', { name: 'Upload' }).click();
  await expect(page.getByText('“holiday.jpg” is not a photo or a PDF')).toBeVisible();
  await expect(gallery.getByRole('listitem')).toHaveCount(1);

  for (const [button, status] of [
    ['Start assessment', 'Being assessed'],
    ['Start work', 'In work'],
    ['Mark ready', 'Ready'],
    ['Hand over', 'Handed over'],
  ] as const) {
    await page.getByRole('region', { name: 'Status' }).getByRole('button', { name: button }).click();
    await page.getByRole('dialog', { name: `${button}?` }).getByRole('button', { name: button }).click();
    await expect(page.getByRole('region', { name: 'Status' })).toContainText(status);
  }
  // Handed over is the end of this visit; the machine can come back in later.
  await expect(page.getByRole('region', { name: 'Status' }).getByRole('button')).toHaveText(['Back in']);
  const timeline = page.getByRole('region', { name: 'Timeline' });
  await expect(timeline).toContainText('Ready → Handed over');
  await expect(timeline).toContainText('Photo added: left-side.jpg');
  await expect(timeline).toContainText('Document added: registration.pdf');
  await page.screenshot({ path: '/tmp/vehicle-page-1280.png', fullPage: true });
  await page.setViewportSize({ width: 820, height: 1180 });
  await page.screenshot({ path: '/tmp/vehicle-page-820.png', fullPage: true });

  await page.getByRole('link', { name: 'Vehicles', exact: true }).first().click();
  await page.getByLabel('Status').selectOption('handed_over');
  await expect(page.getByRole('table', { name: 'Vehicles in the shop' })).toContainText('Corran Tern 350');
  await page.getByLabel('Status').selectOption('in_work');
  await expect(page.getByText('No vehicles match these filters')).toBeVisible();
});

test('the vehicle screens pass axe, in light and dark themes', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signIn(page, userWithRole(shop, 'owner').email, shop.password);
  const created = await page.request.post(`/api/shops/${shopId}/vehicles`, {
    headers: writeHeaders,
    data: { kind: 'shop_stock', marque: 'Velmark', model: 'Valdor 650', year: 1971, frameNumber: 'VD 7-20391', engineNumber: 'VD7E 20391', acquisitionCostMinor: 215000, odometer: { value: 31777, unit: 'mi', readOn: '2026-01-02' } },
  });
  expect(created.status(), await created.text()).toBe(201);
  const vehicle = (await created.json()) as { id: string };
  const photo = await sharp({ create: { width: 320, height: 240, channels: 3, background: '#a3322a' } }).png().toBuffer();
  const uploaded = await page.request.post(`/api/shops/${shopId}/vehicles/${vehicle.id}/files`, { headers: { 'X-CSRF': '1' }, multipart: { files: { name: 'tank.png', mimeType: 'image/png', buffer: photo } } });
  expect(uploaded.status(), await uploaded.text()).toBe(201);

  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    await page.goto(`/shops/${shopId}/vehicles`);
    await expect(page.getByRole('table', { name: 'Vehicles in the shop' })).toBeVisible();
    await expectNoSeriousViolations(page, `vehicle list (${scheme})`);
    await page.goto(`/shops/${shopId}/vehicles/${vehicle.id}`);
    await expect(page.getByRole('heading', { level: 1, name: '1971 Velmark Valdor 650' })).toBeVisible();
    await expect(page.getByRole('table', { name: 'Parts that fit this vehicle' }).or(page.getByText('No parts listed for this vehicle'))).toBeVisible();
    await expectNoSeriousViolations(page, `vehicle page (${scheme})`);
    await page.getByRole('button', { name: 'Edit vehicle' }).click();
    const dialog = page.getByRole('dialog', { name: 'Edit vehicle' });
    await dialog.getByLabel('VIN').fill('1G4AH59H55G118341');
    await dialog.getByRole('button', { name: 'Save vehicle' }).click();
    await expect(dialog.getByRole('alert')).toContainText('should be 4');
    await expectNoSeriousViolations(page, `vehicle form with the VIN warning (${scheme})`);
    if (scheme === 'light') await page.screenshot({ path: '/tmp/vehicle-vin-warning.png' });
    await page.keyboard.press('Escape');
  }
});
