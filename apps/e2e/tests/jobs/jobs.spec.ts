import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { uniqueName, writeHeaders } from '../../fixtures/stack';
import { addBin, addPart, receive, signIn } from '../stock/stock-api';

async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

test('the owner opens a job and assigns a mechanic; the mechanic fills the recommissioning checklist and holds and issues a part', async ({ page, browser }) => {
  test.setTimeout(180_000);
  const shop = await createTestShop({ roles: ['owner', 'mechanic'] });
  const shopId = shop.shop.id;
  const owner = userWithRole(shop, 'owner');
  const mechanic = userWithRole(shop, 'mechanic');
  await signIn(page.request, owner.email, shop.password);

  // Set-up through the API: the shop works in bar, a part in a bin, a stored vehicle.
  expect((await page.request.patch(`/api/shops/${shopId}/settings`, { headers: writeHeaders, data: { pressureUnit: 'bar' } })).status()).toBe(200);
  const number = uniqueName('JB').replace(/\s+/g, '-').toUpperCase().slice(0, 20);
  const part = await addPart(page.request, shopId, { number, description: 'Caliper seal kit' });
  const bin = await addBin(page.request, shopId, `J-${Date.now().toString(36).slice(-5)}`.toUpperCase(), 'Jobs shelf');
  await receive(page.request, shopId, { partId: part.id, binId: bin.id, condition: 'new', quantity: 4, unitCostMinor: 1250 });
  const vehicle = await page.request.post(`/api/shops/${shopId}/vehicles`, { headers: writeHeaders, data: { kind: 'shop_stock', marque: 'Corran', model: 'Tern 350', year: 1967, frameNumber: 'CT 41207' } });
  expect(vehicle.status(), await vehicle.text()).toBe(201);

  // The owner opens the job from the board.
  await page.setViewportSize({ width: 1280, height: 800 });
  await page.goto(`/shops/${shopId}`);
  await page.getByRole('link', { name: 'Jobs', exact: true }).click();
  await page.getByRole('link', { name: 'All jobs' }).click();
  await expect(page.getByText('No jobs here yet')).toBeVisible();
  await expectNoSeriousViolations(page, 'job board (empty)');
  await page.getByRole('button', { name: 'New job' }).click();
  const dialog = page.getByRole('dialog', { name: 'New job' });
  await dialog.getByRole('button', { name: 'Open job' }).click();
  await expect(dialog.getByText('Choose the vehicle.')).toBeVisible();
  await dialog.getByLabel('Vehicle').selectOption({ label: '1967 Corran Tern 350 CT 41207' });
  await dialog.getByLabel('Title').fill('Recommission after storage');
  await dialog.getByLabel('What the customer asked for').fill('Laid up since 2013; make it run.');
  await dialog.getByRole('checkbox', { name: new RegExp(mechanic.name) }).check();
  await dialog.getByRole('checkbox', { name: 'Recommissioning after storage' }).check();
  await dialog.getByRole('button', { name: 'Open job' }).click();
  await expect(page.getByRole('heading', { level: 1, name: /Recommission after storage/ })).toBeVisible();
  await expect(page.getByText(mechanic.name)).toBeVisible();

  // The mechanic, on a workshop tablet.
  const context = await browser.newContext({ viewport: { width: 820, height: 1180 } });
  const tablet = await context.newPage();
  await signIn(tablet.request, mechanic.email, shop.password);
  await tablet.goto(`/shops/${shopId}`);
  // On a tablet in portrait the rail folds into the menu.
  await tablet.getByRole('button', { name: 'Menu' }).click();
  await tablet.getByRole('link', { name: 'Jobs', exact: true }).click();
  await expect(tablet.getByRole('heading', { level: 1, name: 'My jobs' })).toBeVisible();
  await tablet.getByRole('link', { name: /Recommission after storage/ }).click();
  await expect(tablet.getByRole('heading', { level: 1, name: /Recommission after storage/ })).toBeVisible();
  await expectNoSeriousViolations(tablet, 'job page');

  // Tyre age: a three-digit DOT code fails the age check and cannot be marked OK.
  await tablet.getByRole('button', { name: 'Record: Tyre age from the DOT date code' }).click();
  const tyres = tablet.getByRole('listitem').filter({ has: tablet.getByRole('heading', { name: /Tyre age from the DOT date code/ }) });
  await expect(tyres.getByRole('note', { name: /Safety caution: Tyre age/ })).toBeVisible();
  await tyres.getByLabel('Tyre 1 DOT code').fill('DOT 8K4P 2324');
  await tyres.getByLabel('Tyre 2 DOT code').fill('DOT 8K4P 268');
  await tyres.getByLabel('OK', { exact: true }).check();
  await tyres.getByRole('button', { name: 'Save' }).click();
  await expect(tyres.getByText(/The readings give “Fail”/)).toBeVisible();
  await tyres.getByLabel('Fail', { exact: true }).check();
  await tyres.getByRole('button', { name: 'Save' }).click();
  await expect(tyres.getByText(/Rear 8K4P 268|Tyre 2|made before 2000/).first()).toBeVisible();

  // Compression in the shop's unit (bar), stored in kPa and shown back in bar.
  await tablet.getByRole('button', { name: 'Record: Compression per cylinder' }).click();
  const compression = tablet.getByRole('listitem').filter({ has: tablet.getByRole('heading', { name: /Compression per cylinder/ }) });
  await compression.getByLabel('Cylinder 1').fill('9.5');
  await compression.getByLabel('Cylinder 2').fill('9.2');
  await compression.getByLabel('OK', { exact: true }).check();
  await compression.getByRole('button', { name: 'Save' }).click();
  await expect(compression.getByText(/#1 9\.5\u00a0bar, #2 9\.2\u00a0bar/)).toBeVisible();

  // The failed tyre blocks marking the job done.
  await expect(tablet.getByRole('heading', { name: 'Safety-critical items' })).toBeVisible();

  // Hold a part for the job and issue it.
  await tablet.getByLabel('Find a part', { exact: true }).fill(number);
  await tablet.getByRole('button', { name: new RegExp(`Hold 1 × ${number}`) }).click();
  await tablet.getByRole('button', { name: new RegExp(`Issue 1 × ${number} to this job`) }).click();
  const issued = tablet.getByRole('table');
  await expect(issued.getByText(number)).toBeVisible();
  await expect(issued.getByText('£12.50')).toBeVisible();
  await tablet.screenshot({ path: '/tmp/job-page-820.png', fullPage: true });
  await context.close();
});

test('the job page with a checklist open and the template editor pass axe in the dark theme', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signIn(page.request, userWithRole(shop, 'owner').email, shop.password);
  const vehicle = await page.request.post(`/api/shops/${shopId}/vehicles`, { headers: writeHeaders, data: { kind: 'shop_stock', marque: 'Velmark', model: 'Plover', year: 1972, frameNumber: 'VP 2210' } });
  const templates = await page.request.get(`/api/shops/${shopId}/checklist-templates`);
  const recommissioning = ((await templates.json()) as { templates: Array<{ id: string; name: string }> }).templates.find((t) => t.name.startsWith('Recommissioning'))!;
  const job = await page.request.post(`/api/shops/${shopId}/jobs`, { headers: writeHeaders, data: { vehicleId: (await vehicle.json()).id, title: 'Brakes and tyres', customerRequest: '', templateIds: [recommissioning.id] } });
  expect(job.status(), await job.text()).toBe(201);
  await page.emulateMedia({ colorScheme: 'dark' });
  await page.goto(`/shops/${shopId}/jobs/${(await job.json()).id}`);
  await page.getByRole('button', { name: 'Record: Calipers, master cylinders and hoses: no seizing, no leaks' }).click();
  await expect(page.getByRole('note', { name: /Safety caution: Brake fluids do not mix/ })).toBeVisible();
  await expectNoSeriousViolations(page, 'job page with a brake item open (dark)');
  await page.goto(`/shops/${shopId}/checklist-templates`);
  await page.getByRole('button', { name: 'Edit Recommissioning after storage' }).click();
  await expect(page.getByLabel('Item 1 label')).toHaveValue('Tank inside: rust, varnish, old fuel');
  await expectNoSeriousViolations(page, 'template editor (dark)');
});
