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

// One test per screen and theme, so they run in parallel and a slow screen (the API
// documentation is long) has its own time budget.
const signedInScreens = [
  ['home', (shopId: string) => `/shops/${shopId}`],
  ['shop', (shopId: string) => `/shops/${shopId}/shop`],
  ['API documentation', () => '/api-docs'],
  ['not found', () => '/no-such-page'],
  ['purchasing: reorder list', (shopId: string) => `/shops/${shopId}/purchasing/reorder`],
  ['purchasing: orders', (shopId: string) => `/shops/${shopId}/purchasing/orders`],
  ['purchasing: suppliers', (shopId: string) => `/shops/${shopId}/purchasing/suppliers`],
  ['purchasing: returns', (shopId: string) => `/shops/${shopId}/purchasing/returns`],
  ['stock', (shopId: string) => `/shops/${shopId}/stock`],
  ['stock: movements', (shopId: string) => `/shops/${shopId}/stock/movements`],
  ['stock: holds', (shopId: string) => `/shops/${shopId}/stock/holds`],
  ['stock: bins', (shopId: string) => `/shops/${shopId}/stock/bins`],
  ['stock: value', (shopId: string) => `/shops/${shopId}/stock/value`],
  ['vehicles', (shopId: string) => `/shops/${shopId}/vehicles`],
  ['jobs: board', (shopId: string) => `/shops/${shopId}/jobs`],
  ['jobs: checklist templates', (shopId: string) => `/shops/${shopId}/checklist-templates`],
] as const;

for (const scheme of ['light', 'dark'] as const) {
  for (const [name, pathOf] of signedInScreens) {
    test(`signed-in screen: ${name} (${scheme})`, async ({ page }) => {
      test.setTimeout(120_000);
      const shop = await createTestShop({ roles: ['owner'] });
      const signIn = new SignInPage(page);
      await signIn.goto();
      await signIn.signIn(userWithRole(shop, 'owner').email, shop.password);
      await expect(page).toHaveURL(new RegExp(`/shops/${shop.shop.id}$`));
      await page.emulateMedia({ colorScheme: scheme });
      await page.goto(pathOf(shop.shop.id));
      await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
      await expectNoSeriousViolations(page, `${name} (${scheme})`);
    });
  }
}
