import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { addLink, addPart, signInThroughApi } from './catalogue-api';

// axe-core against WCAG 2.x A and AA rules: no serious or critical violation on the catalogue's screens.
async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

test('the catalogue screens, in light and dark themes', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  const kit = await addPart(page.request, shopId, { number: 'K-5500', description: 'Fork seal kit', category: 'Forks' });
  const seal = await addPart(page.request, shopId, { number: '55-001', description: 'Fork seal', category: 'Forks', status: 'nla' });
  const a = await addPart(page.request, shopId, { number: '55-010', description: 'Fork stanchion', category: 'Forks' });
  const b = await addPart(page.request, shopId, { number: '55-011', description: 'Fork stanchion, revised', category: 'Forks' });
  await addLink(page.request, shopId, { fromPartId: kit.id, toPartId: seal.id, kind: 'kit_contains', quantity: 2 });
  // A circle of replacements, so the problem treatment is checked too.
  await addLink(page.request, shopId, { fromPartId: a.id, toPartId: b.id, kind: 'replaced_by' });
  await addLink(page.request, shopId, { fromPartId: b.id, toPartId: a.id, kind: 'replaced_by' });

  for (const scheme of ['light', 'dark'] as const) {
    await page.emulateMedia({ colorScheme: scheme });
    await page.goto(`/shops/${shopId}/catalogue`);
    await expect(page.getByRole('table', { name: 'Parts in the catalogue' })).toBeVisible();
    await expectNoSeriousViolations(page, `catalogue list (${scheme})`);

    await page.getByRole('button', { name: 'Add part' }).click();
    await page.getByRole('dialog', { name: 'Add a part' }).getByRole('button', { name: 'Add part' }).click();
    await expect(page.getByText('Describe the part.')).toBeVisible();
    await expectNoSeriousViolations(page, `add part form with errors (${scheme})`);
    await page.keyboard.press('Escape');

    for (const part of [kit, a]) {
      await page.goto(`/shops/${shopId}/catalogue/${part.id}`);
      await expect(page.getByRole('figure', { name: /Lineage picture/ })).toBeVisible();
      await expectNoSeriousViolations(page, `part ${part.number} (${scheme})`);
    }

    await page.goto(`/shops/${shopId}/catalogue/import`);
    await page.getByLabel('CSV file').setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from('number,description\n55-020,\n', 'utf8') });
    await page.getByRole('button', { name: 'Check file' }).click();
    await expect(page.getByRole('table', { name: /in the file/ })).toBeVisible();
    await expectNoSeriousViolations(page, `import with errors (${scheme})`);
  }
});
