import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../fixtures/shops';
import { SignInPage } from '../pages/sign-in-page';

// axe-core (Deque) against WCAG 2.x A and AA rules: no serious or critical violation on any screen.
async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

test('signed-out screens', async ({ page }) => {
  for (const [path, name] of [
    ['/sign-in', 'sign-in'],
    ['/forgot-password', 'forgot password'],
    ['/reset-password?token=not-a-real-token-but-long-enough', 'reset password'],
  ] as const) {
    await page.goto(path);
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    await expectNoSeriousViolations(page, name);
  }
});

test('signed-in screens, in light and dark themes', async ({ page }) => {
  test.setTimeout(180_000);
  const shop = await createTestShop({ roles: ['owner'], platformAdmin: true });
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(userWithRole(shop, 'owner').email, shop.password);
  await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));
  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    for (const [path, name] of [
      [`/shops/${shop.shop.id}`, 'home'],
      [`/shops/${shop.shop.id}/shop`, 'shop'],
      ['/api-docs', 'API documentation'],
      ['/no-such-page', 'not found'],
    ] as const) {
      await page.goto(path);
      await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
      await expectNoSeriousViolations(page, `${name} (${scheme})`);
    }
  }
});
