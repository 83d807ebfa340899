import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { waitForMail } from '../../fixtures/stack';
import { SignInPage } from '../../pages/sign-in-page';

test('a person resets a forgotten password through the e-mailed link', async ({ page }) => {
  const shop = await createTestShop({ roles: ['buyer'] });
  const buyer = userWithRole(shop, 'buyer');

  await page.goto('/sign-in');
  await page.getByRole('link', { name: /forgot your password/i }).click();
  // The reset form loads on demand: until it is there, "E-mail" is still the sign-in form's field.
  await expect(page.getByRole('heading', { name: 'Reset your password' })).toBeVisible();
  await page.getByLabel('E-mail').fill(buyer.email);
  await expect(page.getByLabel('E-mail')).toHaveValue(buyer.email);
  await page.getByRole('button', { name: 'Send reset link' }).click();
  await expect(page.getByText(/check your inbox/i)).toBeVisible();

  const mail = await waitForMail(buyer.email, /password/i);
  const link = /https?:\/\/\S+\/reset-password\?token=[A-Za-z0-9_-]+/.exec(mail.text)?.[0];
  expect(link, 'the e-mail carries a reset link').toBeTruthy();
  const url = new URL(link!);
  await page.goto(url.pathname + url.search);

  const newPassword = 'a-new-long-password-7';
  await page.getByLabel('New password').fill(newPassword);
  await page.getByRole('button', { name: 'Set new password' }).click();

  const signIn = new SignInPage(page);
  await expect(page).toHaveURL(/\/sign-in/);
  await signIn.signIn(buyer.email, newPassword);
  await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}`));

  // The link works once only.
  await page.context().clearCookies();
  await page.goto(url.pathname + url.search);
  await page.getByLabel('New password').fill('yet-another-password-8');
  await page.getByRole('button', { name: 'Set new password' }).click();
  await expect(page.getByRole('alert')).toContainText(/expired|used|no longer/i);
});
