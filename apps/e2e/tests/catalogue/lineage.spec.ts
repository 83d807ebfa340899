import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { addLink, addPart, signInThroughApi } from './catalogue-api';

test('a mechanic opens an old number and follows its lineage picture to the current part', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner', 'mechanic'] });
  const shopId = shop.shop.id;

  // The owner fills the catalogue: 42-1001 → 42-1002 (both ways) → 42-1003 ×2 (one way).
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  const oldPart = await addPart(page.request, shopId, { number: '42-1001', description: 'Gearbox sprocket seal', status: 'nla' });
  const midPart = await addPart(page.request, shopId, { number: '42-1002', description: 'Gearbox sprocket seal, revised', status: 'nla' });
  const currentPart = await addPart(page.request, shopId, { number: '42-1003', description: 'Sprocket seal half', origin: 'reproduction' });
  await addLink(page.request, shopId, { fromPartId: oldPart.id, toPartId: midPart.id, kind: 'replaced_by', interchange: 'both' });
  await addLink(page.request, shopId, { fromPartId: midPart.id, toPartId: currentPart.id, kind: 'replaced_by', interchange: 'one_way', quantity: 2 });
  await page.context().clearCookies();

  // The mechanic finds the old number in the catalogue.
  await signInThroughApi(page.request, userWithRole(shop, 'mechanic').email, shop.password);
  await page.goto(`/shops/${shopId}`);
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Catalogue' }).click();
  await page.getByRole('searchbox', { name: 'Number or description' }).fill('42-1001');
  await page.keyboard.press('Enter');
  await page.getByRole('table', { name: 'Parts in the catalogue' }).getByRole('link', { name: '42-1001' }).click();

  await expect(page.getByRole('heading', { level: 1 })).toContainText('42-1001');
  await expect(page.getByText('Current orderable number:')).toBeVisible();
  const words = page.getByRole('list', { name: 'Links in the lineage' });
  await expect(words.getByRole('listitem')).toHaveText(['42-1001 is replaced by 42-1002 (×1, fits both ways)', '42-1002 is replaced by 42-1003 (×2, new fits old only)']);

  // Follow the picture one box at a time.
  const picture = page.getByRole('figure', { name: /Lineage picture of 42-1001/ });
  await picture.getByRole('link', { name: /42-1002/ }).click();
  await expect(page.getByRole('heading', { level: 1 })).toContainText('42-1002');
  const next = page.getByRole('figure', { name: /Lineage picture of 42-1002/ }).getByRole('link', { name: /42-1003/ });
  await expect(next).toContainText('Current');
  await next.focus();
  await page.keyboard.press('Enter');
  await expect(page.getByRole('heading', { level: 1 })).toContainText('42-1003');
  await expect(page.getByText('This is the current orderable number.')).toBeVisible();
  // A mechanic reads the catalogue but does not edit it.
  await expect(page.getByRole('button', { name: 'Edit part' })).toHaveCount(0);
});
