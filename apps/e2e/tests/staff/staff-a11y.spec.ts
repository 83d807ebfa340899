import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { waitForMail } from '../../fixtures/stack';
import { SignInPage } from '../../pages/sign-in-page';

// Set STAFF_SCREENSHOTS=/some/folder to keep a picture of each screen for a visual check.
const shotsDir = process.env.STAFF_SCREENSHOTS;

async function check(page: Page, name: string) {
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
  // Wait for the data, not just the frame.
  await expect(page.getByRole('status').filter({ hasText: /loading/i })).toHaveCount(0);
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`), `${name} has no serious accessibility violations`).toEqual([]);
  if (shotsDir) await page.screenshot({ path: `${shotsDir}/${name.replace(/[^a-z0-9]+/gi, '-')}.png`, fullPage: true });
}

test('the shop administration screens, in light and dark themes and on a tablet', async ({ page, browser }) => {
  test.setTimeout(180_000);
  const shop = await createTestShop({ roles: ['owner', 'buyer', 'mechanic'] });
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(userWithRole(shop, 'owner').email, shop.password);
  await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));

  // Something in every table: an open invitation (and with it audit events) and an API key.
  const invitee = `front.desk.${Date.now().toString(36)}@harbour-works.test`;
  await page.goto(`/shops/${shop.shop.id}/staff`);
  await page.getByRole('button', { name: 'Invite someone' }).first().click();
  await page.getByRole('dialog').getByLabel('E-mail').fill(invitee);
  await page.getByRole('dialog').getByLabel('Role').selectOption('viewer');
  if (shotsDir) await page.screenshot({ path: `${shotsDir}/invite-dialog.png` });
  await page.getByRole('dialog').getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByRole('dialog')).toBeHidden();
  await page.goto(`/shops/${shop.shop.id}/api-keys`);
  await page.getByRole('button', { name: 'Create an API key' }).first().click();
  await page.getByRole('dialog').getByLabel('Label').fill('Stock sync');
  await page.getByRole('dialog').getByLabel('Integration name').fill('Web counter');
  await page.getByRole('dialog').getByRole('button', { name: 'Create key' }).click();
  await expect(page.getByRole('dialog').getByLabel('The new key')).toBeVisible();
  await check(page, 'api key shown once');
  await page.getByRole('button', { name: 'I have stored it' }).click();

  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    for (const [path, name] of [
      ['staff', 'staff'],
      ['audit-log', 'audit log'],
      ['api-keys', 'api keys'],
      ['shop', 'settings'],
    ] as const) {
      await page.goto(`/shops/${shop.shop.id}/${path}`);
      await check(page, `${name} ${scheme}`);
    }
  }

  await page.emulateMedia({ colorScheme: 'light' });
  await page.setViewportSize({ width: 800, height: 1100 });
  for (const path of ['staff', 'audit-log']) {
    await page.goto(`/shops/${shop.shop.id}/${path}`);
    await check(page, `${path} tablet`);
  }

  // The public accept page, signed out.
  const mail = await waitForMail(invitee, /invited/i);
  const link = new URL(/https?:\/\/\S+\/accept-invitation\?token=[A-Za-z0-9_-]+/.exec(mail.text)?.[0] ?? 'http://x/');
  const visitor = await browser.newContext();
  const visitorPage = await visitor.newPage();
  await visitorPage.goto(link.pathname + link.search);
  await expect(visitorPage.getByLabel('Your name')).toBeVisible();
  await check(visitorPage, 'accept invitation');
  await visitor.close();
});
