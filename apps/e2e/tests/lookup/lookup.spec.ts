import { expect, test, type APIRequestContext } from '@playwright/test';
import type { Part, PartInput } from '@tappet/contracts';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { writeHeaders } from '../../fixtures/stack';

async function signIn(request: APIRequestContext, email: string, password: string) {
  const res = await request.post('/api/auth/sign-in', { headers: writeHeaders, data: { email, password } });
  expect(res.status(), await res.text()).toBe(200);
}

async function addPart(request: APIRequestContext, shopId: string, input: PartInput): Promise<Part> {
  const res = await request.post(`/api/shops/${shopId}/parts`, { headers: writeHeaders, data: input });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()) as Part;
}

test('a mechanic types a mistyped number and opens the right part with the keyboard alone', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner', 'mechanic'] });
  const shopId = shop.shop.id;
  await signIn(page.request, userWithRole(shop, 'owner').email, shop.password);
  const wanted = await addPart(page.request, shopId, { number: '71-3456', description: 'Clutch cable, inner', category: 'Controls' });
  await addPart(page.request, shopId, { number: '58-1200', description: 'Fork seal', category: 'Forks' });
  await addPart(page.request, shopId, { number: '71-9901', description: 'Throttle cable', category: 'Controls' });
  // The owner prices the wanted part, so the result can quote it.
  const priced = await page.request.put(`/api/shops/${shopId}/sales/parts/${wanted.id}/list-price`, { headers: writeHeaders, data: { listPriceMinor: 2499 } });
  expect(priced.status(), await priced.text()).toBe(200);
  // The lookup is for everyone in the shop: the mechanic does it.
  await signIn(page.request, userWithRole(shop, 'mechanic').email, shop.password);

  await page.goto(`/shops/${shopId}/lookup`);
  const field = page.getByRole('combobox', { name: 'Look up a part' });
  await expect(field).toBeFocused();
  // Two digits swapped and a dot for the dash.
  await page.keyboard.type('71.4356');
  const first = page.getByRole('listbox', { name: 'Lookup results' }).getByRole('option').first();
  await expect(first).toContainText('71-3456');
  await expect(first).toContainText('close to 71-3456 (1 typo)');
  await expect(first).toHaveAttribute('aria-selected', 'true');
  await expect(first.getByTestId('lookup-sell-price')).toHaveText(/^Sell \D*24\.99 before tax$/);
  await page.keyboard.press('Enter');
  await expect(page).toHaveURL(new RegExp(`/shops/${shopId}/catalogue/${wanted.id}$`));
  await expect(page.getByText('Clutch cable, inner').first()).toBeVisible();

  // Back on the lookup, the part is remembered, and "/" returns to the field from anywhere on the page.
  await page.goto(`/shops/${shopId}/lookup`);
  await expect(page.getByRole('region', { name: 'Recent lookups' })).toContainText('71-3456');
  await page.getByRole('heading', { name: 'Recent lookups' }).click();
  await page.keyboard.press('/');
  await expect(field).toBeFocused();
});

test('a scanned code followed by Enter opens the exact part directly', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signIn(page.request, userWithRole(shop, 'owner').email, shop.password);
  const wanted = await addPart(page.request, shopId, { number: 'VX/880', description: 'Float needle', supplierNumbers: ['50123456'] });
  await page.goto(`/shops/${shopId}/lookup`);
  await expect(page.getByRole('combobox', { name: 'Look up a part' })).toBeFocused();
  // A keyboard-wedge scanner: the supplier's barcode digits a few milliseconds apart, then Enter.
  await page.keyboard.type('50123456', { delay: 5 });
  await page.keyboard.press('Enter');
  await expect(page).toHaveURL(new RegExp(`/shops/${shopId}/catalogue/${wanted.id}$`));
});

test('narrowing the lookup to a vehicle leaves out parts that do not fit it, and the link keeps the filter', async ({ page }) => {
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signIn(page.request, userWithRole(shop, 'owner').email, shop.password);
  const corran = await addPart(page.request, shopId, { number: '40-1100', description: 'Brake shoe set, front', category: 'Brakes' });
  const velmark = await addPart(page.request, shopId, { number: '40-1101', description: 'Brake shoe set, rear', category: 'Brakes' });
  for (const [part, marque] of [[corran, 'Corran'], [velmark, 'Velmark']] as const) {
    const res = await page.request.post(`/api/shops/${shopId}/fitments`, { headers: writeHeaders, data: { partId: part.id, marque, model: 'Tourer', yearFrom: 1960, yearTo: 1970 } });
    expect(res.status(), await res.text()).toBe(201);
  }

  await page.goto(`/shops/${shopId}/lookup`);
  await expect(page.getByRole('combobox', { name: 'Look up a part' })).toBeFocused();
  await page.keyboard.type('brake shoe');
  const results = page.getByRole('listbox', { name: 'Lookup results' });
  await expect(results.getByRole('option')).toHaveCount(2);

  await page.getByRole('button', { name: 'Narrow down' }).click();
  const form = page.getByRole('search', { name: 'Narrow the lookup' });
  await form.getByRole('textbox', { name: 'Marque' }).fill('Velmark');
  await form.getByRole('textbox', { name: 'Year' }).fill('1965');
  await form.getByRole('textbox', { name: 'Year' }).press('Enter');
  await expect(page.getByText('Fits Velmark 1965')).toBeVisible();
  await expect(results.getByRole('option')).toHaveCount(1);
  await expect(results.getByRole('option').first()).toContainText('40-1101');

  // The filter is in the address: a reload keeps it.
  await page.reload();
  await expect(page.getByRole('combobox', { name: 'Look up a part' })).toBeFocused();
  await page.keyboard.type('brake shoe');
  await expect(page.getByRole('listbox', { name: 'Lookup results' }).getByRole('option')).toHaveCount(1);
  await page.getByRole('button', { name: 'Clear' }).click();
  await expect(page.getByRole('listbox', { name: 'Lookup results' }).getByRole('option')).toHaveCount(2);
});
