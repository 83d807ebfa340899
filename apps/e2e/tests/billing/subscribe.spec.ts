import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { SignInPage } from '../../pages/sign-in-page';
import { failNextRenewal, fakeStripeUrl, subscriptionOf } from './fake-stripe';

test('an owner subscribes through the checkout page and the shop becomes active; a failed renewal makes it past due and the banner appears', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(userWithRole(shop, 'owner').email, shop.password);
  await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));

  await test.step('a new shop is on its trial, without a card', async () => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Billing', exact: true }).click();
    await expect(page.getByRole('heading', { level: 1, name: 'Billing' })).toBeVisible();
    await expect(page.getByTestId('trial-days')).toContainText('14 days left in the free trial');
  });

  await test.step('subscribing goes through the checkout page and back', async () => {
    await page.getByRole('radio', { name: /Workbench/ }).check();
    await page.getByRole('button', { name: 'Subscribe with Stripe Checkout' }).click();
    await expect(page).toHaveURL(new RegExp(`^${fakeStripeUrl}/checkout/`));
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    await page.getByRole('button', { name: 'Pay' }).click();
    await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}/billing\\?checkout=done$`));
    await expect(page.getByRole('status').filter({ hasText: 'the subscription is active' })).toBeVisible();
    await expect(page.getByRole('main').getByText('Active', { exact: true })).toBeVisible();
    await expect(page.getByRole('button', { name: 'Manage in the billing portal' })).toBeVisible();
    await expect(page.getByRole('region', { name: 'Payment overdue' })).toHaveCount(0);
  });

  await test.step('a failed renewal makes the shop past due, and the banner offers the portal', async () => {
    await failNextRenewal(await subscriptionOf(shop.shop.id));
    await page.goto(`/shops/${shop.shop.id}`);
    const banner = page.getByRole('region', { name: 'Payment overdue' });
    await expect(banner).toBeVisible();
    await expect(banner).toContainText('the shop becomes read-only');
    await expect(banner.getByRole('button', { name: 'Pay in the billing portal' })).toBeVisible();
  });

  await test.step('paying in the portal lifts the banner', async () => {
    await page.getByRole('region', { name: 'Payment overdue' }).getByRole('button', { name: 'Pay in the billing portal' }).click();
    await expect(page).toHaveURL(new RegExp(`^${fakeStripeUrl}/portal/`));
    await page.getByRole('button', { name: /^Pay / }).first().click();
    await page.getByRole('link', { name: 'Back to Tappet' }).first().click();
    await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}/billing`));
    await expect(page.getByRole('main').getByText('Active', { exact: true })).toBeVisible();
    await expect(page.getByRole('region', { name: 'Payment overdue' })).toHaveCount(0);
  });
});
