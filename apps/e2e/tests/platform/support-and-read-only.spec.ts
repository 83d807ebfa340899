import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { SignInPage } from '../../pages/sign-in-page';

// Issue 11: a platform admin opens a shop only under its owner's grant, from the console, and sees
// what support may do; a shop suspended by hand shows no write controls to its own people.
test('support access opens the shop from the console; a suspended shop hides what it would refuse', async ({ page, browser }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const adminShop = await createTestShop({ roles: [], platformAdmin: true });
  const shopName = shop.shop.name;

  // The owner grants support access on the shop's Support access page.
  await new SignInPage(page).goto();
  await new SignInPage(page).signIn(userWithRole(shop, 'owner').email, shop.password);
  await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));
  await page.goto(`/shops/${shop.shop.id}/support-access`);
  await page.getByLabel('What do you need help with? (optional)').fill('Catalogue import looks wrong');
  await page.getByRole('button', { name: 'Grant support access' }).click();
  await expect(page.getByRole('main')).toContainText('Granted');

  // The admin finds the shop in the console and opens it.
  const adminContext = await browser.newContext();
  const admin = await adminContext.newPage();
  await new SignInPage(admin).goto();
  await new SignInPage(admin).signIn(userWithRole(adminShop, 'platform_admin').email, adminShop.password);
  await expect(admin).toHaveURL(/\/platform$/);
  await admin.getByLabel('Search').fill(shopName);
  await admin.getByRole('button', { name: 'Show shops' }).click();
  await admin.getByRole('link', { name: `Open ${shopName}` }).click();
  await expect(admin).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));
  const notice = admin.getByRole('region', { name: 'Support access' });
  await expect(notice).toContainText(`Support access to ${shopName}`);
  await expect(notice).toContainText('recorded and shown to the owner');
  const links = await new SignInPage(admin).navLinks();
  expect(links).toContain('Catalogue');
  expect(links).not.toContain('Staff');
  expect(links).not.toContain('Billing');
  await admin.goto(`/shops/${shop.shop.id}/catalogue`);
  await expect(admin.getByRole('button', { name: 'Add part' })).toBeVisible();

  // The admin suspends the shop by hand with a reason.
  await admin.goto('/platform');
  await admin.getByLabel('Search').fill(shopName);
  await admin.getByRole('button', { name: 'Show shops' }).click();
  await admin.getByRole('button', { name: `Suspend ${shopName}` }).click();
  const dialog = admin.getByRole('dialog', { name: `Suspend ${shopName}?` });
  await dialog.getByLabel('Reason').fill('Asked by the owner while the books are checked');
  await dialog.getByRole('button', { name: 'Suspend shop' }).click();
  await expect(dialog).toBeHidden();
  await adminContext.close();

  // The owner's catalogue now reads but offers nothing that writes.
  await page.goto(`/shops/${shop.shop.id}/catalogue`);
  await expect(page.getByRole('region', { name: 'Read-only shop' })).toBeVisible();
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Catalogue');
  await expect(page.getByRole('button', { name: 'Add part' })).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Add a part' })).toHaveCount(0);
});
