import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { apiContext, writeHeaders } from '../../fixtures/stack';
import { SignInPage } from '../../pages/sign-in-page';

// Set BILLING_SCREENSHOTS=/some/folder to keep a picture of each screen for a visual check.
const shotsDir = process.env.BILLING_SCREENSHOTS;

async function check(page: Page, name: string) {
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
  await expect(page.getByRole('status').filter({ hasText: /loading/i })).toHaveCount(0);
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`), `${name} has no serious accessibility violations`).toEqual([]);
  if (shotsDir) await page.screenshot({ path: `${shotsDir}/${name.replace(/[^a-z0-9]+/gi, '-')}.png`, fullPage: true });
}

/** A platform admin's API session, to suspend a shop or let support look in. */
async function adminApi(email: string, password: string) {
  const ctx = await apiContext();
  const res = await ctx.post('/api/auth/sign-in', { headers: writeHeaders, data: { email, password } });
  if (!res.ok()) throw new Error(`admin sign-in: ${res.status()}`);
  return ctx;
}

for (const viewport of [
  { width: 1280, height: 800, label: 'desk' },
  { width: 820, height: 1180, label: 'tablet' },
]) {
  test(`billing, support access and the platform console are accessible (${viewport.label})`, async ({ page, browser }) => {
    test.setTimeout(150_000);
    await page.setViewportSize({ width: viewport.width, height: viewport.height });
    const shop = await createTestShop({ roles: ['owner', 'buyer'], platformAdmin: true });
    const owner = userWithRole(shop, 'owner');
    const admin = userWithRole(shop, 'platform_admin');
    const signIn = new SignInPage(page);
    await signIn.goto();
    await signIn.signIn(owner.email, shop.password);
    await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));

    await page.goto(`/shops/${shop.shop.id}/billing`);
    await expect(page.getByTestId('trial-days')).toBeVisible();
    await check(page, `billing-trial-${viewport.label}`);

    // Support access: granted, then support looks at the catalogue, so the activity list has rows.
    await page.goto(`/shops/${shop.shop.id}/support-access`);
    await check(page, `support-access-none-${viewport.label}`);
    await page.getByLabel('What do you need help with? (optional)').fill('The import skipped a row');
    await page.getByRole('button', { name: 'Grant support access' }).click();
    await expect(page.getByRole('heading', { name: 'Support can see this shop' })).toBeVisible();
    const adminCtx = await adminApi(admin.email, shop.password);
    expect((await adminCtx.get(`/api/shops/${shop.shop.id}/parts`)).status()).toBe(200);
    await page.reload();
    await expect(page.getByRole('table', { name: 'What support did' }).getByRole('row')).toHaveCount(2);
    await check(page, `support-access-granted-${viewport.label}`);
    await page.getByRole('button', { name: 'End support access now' }).click();
    await page.getByRole('alertdialog').getByRole('button', { name: 'End support access' }).click();
    await expect(page.getByRole('button', { name: 'Grant support access' })).toBeVisible();
    expect((await adminCtx.get(`/api/shops/${shop.shop.id}/parts`)).status()).toBe(404);

    // Suspended by hand: the read-only notice, and a write refused with the reason.
    expect((await adminCtx.post(`/api/platform/shops/${shop.shop.id}/suspend`, { headers: writeHeaders, data: { reason: 'Card dispute under review' } })).status()).toBe(200);
    await page.goto(`/shops/${shop.shop.id}`);
    const notice = page.getByRole('region', { name: 'Read-only shop' });
    await expect(notice).toContainText('Card dispute under review');
    await check(page, `read-only-notice-${viewport.label}`);
    expect((await adminCtx.post(`/api/platform/shops/${shop.shop.id}/reactivate`, { headers: writeHeaders, data: { reason: 'Dispute settled' } })).status()).toBe(200);
    await adminCtx.dispose();

    // The platform console, as the admin.
    const adminContext = await browser.newContext({ viewport: { width: viewport.width, height: viewport.height } });
    const adminPage = await adminContext.newPage();
    const adminSignIn = new SignInPage(adminPage);
    await adminSignIn.goto();
    await adminSignIn.signIn(admin.email, shop.password);
    await expect(adminPage).toHaveURL(/\/platform$/);
    await expect(adminPage.getByRole('table', { name: 'Shops' })).toBeVisible();
    await check(adminPage, `platform-shops-${viewport.label}`);
    await adminPage.getByRole('button', { name: 'Onboard a shop' }).first().click();
    await check(adminPage, `platform-onboard-dialog-${viewport.label}`);
    await adminPage.keyboard.press('Escape');
    await adminPage.goto('/platform/plans');
    await expect(adminPage.getByRole('table', { name: 'Plans' })).toBeVisible();
    await check(adminPage, `platform-plans-${viewport.label}`);
    await adminContext.close();
  });
}
