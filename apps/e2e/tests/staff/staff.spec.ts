import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole, type TestShop } from '../../fixtures/shops';
import { waitForMail } from '../../fixtures/stack';
import { SignInPage } from '../../pages/sign-in-page';

/** Signs the shop's owner in on `page` and waits for the shop's home. */
async function signInOwner(page: Page, shop: TestShop) {
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(userWithRole(shop, 'owner').email, shop.password);
  await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));
  return signIn;
}

async function openFromRail(page: Page, name: string) {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name, exact: true }).click();
  await expect(page.getByRole('heading', { level: 1, name, exact: true })).toBeVisible();
}

test('the owner invites a mechanic, who accepts by e-mail and sees only a mechanic’s screens; the owner finds it in the audit log', async ({ browser }) => {
  const shop = await createTestShop({ roles: ['owner'] });
  const mechanicEmail = `mechanic.${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@harbour-works.test`;
  const mechanicName = 'Rowan Spokeshave';

  // The owner invites from the Staff screen.
  const ownerContext = await browser.newContext();
  const owner = await ownerContext.newPage();
  await signInOwner(owner, shop);
  await openFromRail(owner, 'Staff');
  await owner.getByRole('button', { name: 'Invite someone' }).first().click();
  const dialog = owner.getByRole('dialog', { name: 'Invite someone' });
  await dialog.getByLabel('E-mail').fill(mechanicEmail);
  await dialog.getByLabel('Role').selectOption('mechanic');
  await dialog.getByRole('button', { name: 'Send invitation' }).click();
  await expect(owner.getByText(`Invitation sent to ${mechanicEmail} as mechanic.`)).toBeVisible();
  await expect(dialog).toBeHidden();
  const invitations = owner.getByRole('table', { name: 'Open invitations' });
  await expect(invitations.getByRole('row').filter({ hasText: mechanicEmail })).toContainText('Mechanic');

  // The invitation arrives in the mail sink with a one-time link.
  const mail = await waitForMail(mechanicEmail, /invited/i);
  const link = /https?:\/\/\S+\/accept-invitation\?token=[A-Za-z0-9_-]+/.exec(mail.text)?.[0];
  expect(link, 'the e-mail carries an invitation link').toBeTruthy();
  const url = new URL(link!);

  // The mechanic, in a browser of their own, accepts with a name and a password.
  const mechanicContext = await browser.newContext();
  const mechanic = await mechanicContext.newPage();
  await mechanic.goto(url.pathname + url.search);
  await expect(mechanic.getByRole('heading', { level: 1, name: 'Accept your invitation' })).toBeVisible();
  await expect(mechanic.getByRole('main')).toContainText(shop.shop.name);
  await expect(mechanic.getByRole('main')).toContainText('Mechanic');
  await mechanic.getByLabel('Your name').fill(mechanicName);
  await mechanic.getByLabel('Choose a password').fill('bench-vice-and-feeler-gauge');
  await mechanic.getByRole('button', { name: /accept and join/i }).click();

  // Signed in as the mechanic, in the shop, with a mechanic's rail only.
  await expect(mechanic).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));
  await expect(mechanic.getByText(mechanicName).first()).toBeVisible();
  const links = await new SignInPage(mechanic).navLinks();
  expect(links).toEqual(expect.arrayContaining(['Lookup', 'Home']));
  for (const ownerOnly of ['Staff', 'Audit log', 'API keys', 'Shop']) expect(links, `a mechanic has no ${ownerOnly} link`).not.toContain(ownerOnly);
  // And the owner's pages, opened by URL, say they are the owner's.
  await mechanic.goto(`/shops/${shop.shop.id}/staff`);
  await expect(mechanic.getByText('This page is for the shop’s owner')).toBeVisible();
  await expect(mechanic.getByRole('table')).toHaveCount(0);

  // The link works once only.
  await mechanicContext.clearCookies();
  await mechanic.goto(url.pathname + url.search);
  await expect(mechanic.getByRole('alert')).toContainText(/expired|used|withdrawn/i);
  await mechanicContext.close();

  // The owner sees the new member, and finds both changes in the audit log.
  await owner.reload();
  const people = owner.getByRole('table', { name: 'People in the shop' });
  await expect(people.getByRole('row').filter({ hasText: mechanicName })).toContainText('Active');
  await expect(owner.getByRole('table', { name: 'Open invitations' })).toHaveCount(0);

  await openFromRail(owner, 'Audit log');
  const log = owner.getByRole('table', { name: /audit events/i });
  const invited = log.getByRole('row').filter({ hasText: 'Invited someone' }).filter({ hasText: mechanicEmail });
  await expect(invited).toHaveCount(1);
  await expect(invited).toContainText(userWithRole(shop, 'owner').name);
  const joined = log.getByRole('row').filter({ hasText: 'Accepted an invitation' });
  await expect(joined).toContainText(mechanicName);

  // Filtering by the mechanic leaves only what they did; the CSV link carries the same filter.
  await owner.getByLabel('Person or key').selectOption({ label: mechanicName });
  await expect(log.getByRole('row').filter({ hasText: 'Invited someone' })).toHaveCount(0);
  await expect(log.getByRole('row').filter({ hasText: 'Accepted an invitation' })).toHaveCount(1);
  await expect(owner.getByRole('link', { name: 'Download these events as CSV' })).toHaveAttribute('href', /audit-events\.csv\?actor=/);
  await ownerContext.close();
});

test('the last owner cannot be deactivated or demoted, and the screen says why', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner', 'buyer'] });
  await signInOwner(page, shop);
  await openFromRail(page, 'Staff');
  const ownerName = userWithRole(shop, 'owner').name;

  await page.getByRole('button', { name: `Actions for ${ownerName}` }).click();
  await page.getByRole('menuitem', { name: 'Deactivate' }).click();
  const confirm = page.getByRole('alertdialog', { name: `Deactivate ${ownerName}?` });
  await expect(confirm).toContainText('signed out of Tappet at once');
  await confirm.getByRole('button', { name: 'Deactivate and sign out' }).click();
  await expect(confirm.getByRole('alert')).toContainText('A shop must keep at least one active owner.');
  await confirm.getByRole('button', { name: 'Cancel' }).click();

  await page.getByRole('button', { name: `Actions for ${ownerName}` }).click();
  await page.getByRole('menuitem', { name: 'Change role' }).click();
  const roleDialog = page.getByRole('dialog', { name: `Change ${ownerName}’s role` });
  await roleDialog.getByLabel('Role').selectOption('viewer');
  await roleDialog.getByRole('button', { name: 'Change role' }).click();
  await expect(roleDialog.getByRole('alert')).toContainText('A shop must keep at least one active owner.');
  await roleDialog.getByRole('button', { name: 'Cancel' }).click();
  await expect(page.getByRole('table', { name: 'People in the shop' }).getByRole('row').filter({ hasText: ownerName })).toContainText('Owner');

  // A buyer's spending limit is set in the shop's currency.
  const buyerName = userWithRole(shop, 'buyer').name;
  await page.getByRole('button', { name: `Actions for ${buyerName}` }).click();
  await page.getByRole('menuitem', { name: 'Set spending limit' }).click();
  const limit = page.getByRole('dialog', { name: `Spending limit for ${buyerName}` });
  await limit.getByLabel(/spending limit/i).fill('750');
  await limit.getByRole('button', { name: 'Save limit' }).click();
  await expect(page.getByRole('table', { name: 'People in the shop' }).getByRole('row').filter({ hasText: buyerName })).toContainText('750.00');
});

test('an API key is shown once, then listed without its secret, and can be revoked', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner'] });
  await signInOwner(page, shop);
  await openFromRail(page, 'API keys');
  await expect(page.getByText('No API keys yet')).toBeVisible();

  await page.getByRole('button', { name: 'Create an API key' }).first().click();
  const dialog = page.getByRole('dialog', { name: 'Create an API key' });
  await dialog.getByRole('button', { name: 'Create key' }).click();
  await expect(dialog.getByLabel('Label')).toHaveAccessibleDescription(/give the key a label/i);
  await dialog.getByLabel('Label').fill('Stock sync');
  await dialog.getByLabel('Role').selectOption('viewer');
  await dialog.getByLabel('Integration name').fill('Web counter');
  await dialog.getByRole('button', { name: 'Create key' }).click();

  const shown = page.getByRole('dialog', { name: 'Key “Stock sync” created' });
  await expect(shown).toContainText('shown this once');
  const secret = await shown.getByLabel('The new key').inputValue();
  expect(secret).toMatch(/^tpk_/);
  await shown.getByRole('button', { name: 'I have stored it' }).click();
  await expect(shown).toBeHidden();

  const row = page.getByRole('table', { name: 'API keys' }).getByRole('row').filter({ hasText: 'Stock sync' });
  await expect(row).toContainText('Integration “Web counter”');
  await expect(row).toContainText('Never');
  expect(await page.content()).not.toContain(secret);

  await row.getByRole('button', { name: 'Revoke “Stock sync”' }).click();
  await page.getByRole('alertdialog').getByRole('button', { name: 'Revoke key' }).click();
  await expect(row).toContainText('Revoked');
});

test('the owner changes settings, with per-field errors from the contract', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner'] });
  await signInOwner(page, shop);
  await openFromRail(page, 'Shop');
  await page.getByLabel('Currency').fill('XX1');
  await page.getByLabel('Service level').fill('1.5');
  await page.getByRole('button', { name: 'Save settings' }).click();
  await expect(page.getByLabel('Currency')).toHaveAccessibleDescription(/three-letter/i);
  await expect(page.getByLabel('Service level')).toHaveAccessibleDescription(/0\.5 to 0\.999/);
  await expect(page.getByLabel('Currency')).toBeFocused();

  await page.getByLabel('Currency').fill('eur');
  await page.getByLabel('Service level').fill('0.97');
  await page.getByLabel(/labour rate per hour/i).fill('72.50');
  await page.getByLabel('Distance').selectOption('km');
  await page.getByRole('button', { name: 'Save settings' }).click();
  await expect(page.getByText('Settings saved.')).toBeVisible();
  await page.reload();
  await expect(page.getByLabel('Currency')).toHaveValue('EUR');
  await expect(page.getByLabel(/labour rate per hour \(EUR\)/i)).toHaveValue('72.50');
  await expect(page.getByLabel('Distance')).toHaveValue('km');
  await expect(page.getByRole('link', { name: 'Download everything (.zip)' })).toHaveAttribute('href', `/api/shops/${shop.shop.id}/export.zip`);
});
