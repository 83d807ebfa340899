import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { SignInPage } from '../../pages/sign-in-page';

test.describe('sign in per role', () => {
  test('each role sees its own navigation, and only the owner manages the shop', async ({ browser }) => {
    const shop = await createTestShop({ roles: ['owner', 'mechanic', 'buyer', 'viewer'] });
    const expected: Record<string, { shopLink: boolean }> = {
      owner: { shopLink: true },
      mechanic: { shopLink: false },
      buyer: { shopLink: false },
      viewer: { shopLink: false },
    };
    for (const [role, want] of Object.entries(expected)) {
      const context = await browser.newContext();
      const page = await context.newPage();
      const signIn = new SignInPage(page);
      await signIn.goto();
      await signIn.signIn(userWithRole(shop, role as 'owner').email, shop.password);
      await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));
      const links = await signIn.navLinks();
      expect(links, `${role}'s navigation`).toContain('Home');
      expect(links.includes('Shop'), `${role} sees the Shop link`).toBe(want.shopLink);
      await expect(page.getByRole('main')).toContainText(shop.shop.name);
      await context.close();
    }
  });

  test('a wrong password is refused with a message and nothing else happens', async ({ page }) => {
    const shop = await createTestShop({ roles: ['mechanic'] });
    const signIn = new SignInPage(page);
    await signIn.goto();
    await signIn.signIn(userWithRole(shop, 'mechanic').email, 'not-the-password');
    await expect(page.getByRole('alert')).toBeVisible();
    await expect(page).toHaveURL(/\/sign-in/);
  });

  test('the owner renames the shop and signing out ends the session', async ({ page }) => {
    const shop = await createTestShop({ roles: ['owner'] });
    const signIn = new SignInPage(page);
    await signIn.goto();
    await signIn.signIn(userWithRole(shop, 'owner').email, shop.password);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Shop' }).click();
    // The home page has the same form: wait until the Shop page has replaced it.
    await expect(page.getByRole('heading', { level: 1, name: 'Shop', exact: true })).toBeVisible();
    const newName = `${shop.shop.name} Restorations`;
    await page.getByLabel('Shop name').fill(newName);
    await page.getByRole('button', { name: /save/i }).click();
    await expect(page.getByText(`Shop renamed to ${newName}.`)).toBeVisible();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await expect(page).toHaveURL(/\/sign-in/);
    await page.goto(`/shops/${shop.shop.id}`);
    await expect(page).toHaveURL(/\/sign-in/);
  });
});

test('a platform admin without a shop lands on the platform home, with no shop data', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner'], platformAdmin: true });
  const admin = userWithRole(shop, 'platform_admin');
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(admin.email, shop.password);
  await expect(page).toHaveURL(/\/platform$/);
  expect(await signIn.navLinks()).not.toContain('Shop');
  // The admin is no member of the shop: its pages are not found for them.
  await page.goto(`/shops/${shop.shop.id}`);
  await expect(page.getByRole('heading', { level: 1 })).toContainText(/not found/i);
});

test.describe('on a workshop tablet', () => {
  test.use({ viewport: { width: 800, height: 1100 }, hasTouch: true });
  test('the navigation opens from the menu button', async ({ page }) => {
    const shop = await createTestShop({ roles: ['mechanic'] });
    const signIn = new SignInPage(page);
    await signIn.goto();
    await signIn.signIn(userWithRole(shop, 'mechanic').email, shop.password);
    await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));
    await page.getByRole('button', { name: 'Menu' }).click();
    await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Home' })).toBeVisible();
  });
});
