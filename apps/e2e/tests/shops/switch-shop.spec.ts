import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { SignInPage } from '../../pages/sign-in-page';

test('a person in two shops switches between them, and the screens follow the role in each', async ({ page }) => {
  const second = await createTestShop({ roles: ['owner'], namePrefix: 'Second Shop' });
  const first = await createTestShop({ roles: ['owner'], namePrefix: 'First Shop', alsoMemberOf: [{ shopId: second.shop.id, role: 'mechanic' }] });
  const owner = userWithRole(first, 'owner');

  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(owner.email, first.password);
  await expect(page).toHaveURL(new RegExp(`/shops/${first.shop.id}$`));
  expect(await signIn.navLinks()).toContain('Shop');

  await page.getByRole('button', { name: 'Switch shop' }).click();
  await page.getByRole('menuitem', { name: new RegExp(second.shop.name) }).click();
  await expect(page).toHaveURL(new RegExp(`/shops/${second.shop.id}$`));
  await expect(page.getByRole('main')).toContainText(second.shop.name);
  // A mechanic there: no shop administration.
  expect(await signIn.navLinks()).not.toContain('Shop');

  // The choice is remembered by the session: a fresh visit to / lands in the second shop.
  await page.goto('/');
  await expect(page).toHaveURL(new RegExp(`/shops/${second.shop.id}$`));
});

test('a shop the person does not belong to is not found', async ({ page }) => {
  const mine = await createTestShop({ roles: ['viewer'] });
  const theirs = await createTestShop({ roles: ['owner'] });
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(userWithRole(mine, 'viewer').email, mine.password);
  await expect(page).toHaveURL(new RegExp(`/shops/${mine.shop.id}$`));
  await page.goto(`/shops/${theirs.shop.id}`);
  await expect(page.getByRole('main')).not.toContainText(theirs.shop.name);
  await expect(page.getByRole('heading', { level: 1 })).toContainText(/not found|no such|isn't here|not here/i);
});
