import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { uniqueName, waitForMail } from '../../fixtures/stack';
import { SignInPage } from '../../pages/sign-in-page';

test('a platform admin onboards a new shop, and its owner signs in through the invitation e-mail', async ({ page, browser }) => {
  test.setTimeout(120_000);
  const adminShop = await createTestShop({ roles: [], platformAdmin: true });
  const admin = userWithRole(adminShop, 'platform_admin');
  const shopName = uniqueName('Saltmarsh Motors');
  const ownerEmail = `owner.${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@saltmarsh-motors.test`;

  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(admin.email, adminShop.password);
  await expect(page).toHaveURL(/\/platform$/);
  await expect(page.getByRole('heading', { level: 1, name: 'Platform' })).toBeVisible();

  await page.getByRole('button', { name: 'Onboard a shop' }).first().click();
  const dialog = page.getByRole('dialog', { name: 'Onboard a shop' });
  // Nothing is lost on bad input: the errors name the fields.
  await dialog.getByRole('button', { name: 'Create shop and invite owner' }).click();
  await expect(dialog.getByText('Choose a plan.')).toBeVisible();
  await dialog.getByLabel('Shop name').fill(shopName);
  const workbench = await dialog.getByLabel('Plan').locator('option', { hasText: 'Workbench' }).getAttribute('value');
  await dialog.getByLabel('Plan').selectOption(workbench!);
  await dialog.getByLabel('Owner’s e-mail address').fill(ownerEmail);
  await dialog.getByRole('button', { name: 'Create shop and invite owner' }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByText(`The invitation went to ${ownerEmail}.`)).toBeVisible();

  // Find it in the list.
  await page.getByLabel('Search').fill(shopName);
  await page.getByRole('button', { name: 'Show shops' }).click();
  const row = page.getByRole('table', { name: 'Shops' }).getByRole('row').filter({ hasText: shopName });
  await expect(row).toContainText('Workbench');
  await expect(row).toContainText('Trial');
  await expect(row).toContainText('1 / 3');

  // The owner accepts in a browser of their own and lands in the new shop, as its owner.
  const mail = await waitForMail(ownerEmail, /invited/i);
  const link = /https?:\/\/\S+\/accept-invitation\?token=[A-Za-z0-9_-]+/.exec(mail.text)?.[0];
  expect(link, 'the e-mail carries an invitation link').toBeTruthy();
  const url = new URL(link!);
  const ownerContext = await browser.newContext();
  const owner = await ownerContext.newPage();
  await owner.goto(url.pathname + url.search);
  await expect(owner.getByRole('main')).toContainText(shopName);
  await owner.getByLabel('Your name').fill('Rhoda Veck');
  await owner.getByLabel('Choose a password').fill('tidal-brass-and-gearbox');
  await owner.getByRole('button', { name: /accept and join/i }).click();
  await expect(owner).toHaveURL(/\/shops\/[0-9a-f-]{36}$/);
  const links = await new SignInPage(owner).navLinks();
  expect(links).toEqual(expect.arrayContaining(['Staff', 'Billing', 'Support access']));
  await owner.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Billing', exact: true }).click();
  await expect(owner.getByRole('main')).toContainText('Workbench');
  await expect(owner.getByTestId('trial-days')).toContainText('14 days left');
  await ownerContext.close();
});

test('a shop user gets "not found" on the platform console', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner'] });
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(userWithRole(shop, 'owner').email, shop.password);
  await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));
  await page.goto('/platform');
  await expect(page.getByRole('heading', { level: 1 })).toContainText(/not found/i);
});
