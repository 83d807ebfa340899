import AxeBuilder from '@axe-core/playwright';
import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { writeHeaders } from '../../fixtures/stack';
import { addBin, addPart, receive, replacedBy, signIn } from '../stock/stock-api';

// Issue 10's journey: a stored vehicle through a recommissioning job. Measurements, parts found
// through a superseded number held and issued, a failed brake item that blocks hand-over until it
// is fixed, the vehicle handed over, and the job's cost read off the job page.

/** A 24 × 16 PNG made with sharp (the API re-encodes it). */
const png = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAABgAAAAQCAIAAACDRijCAAAACXBIWXMAAAPoAAAD6AG1e1JrAAAAIElEQVQ4jWOoCjKgCmIYNahqNIyqRtNR0GgWCSI/HQAA9hJ6EKKz9mAAAAAASUVORK5CYII=', 'base64');

async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

interface Template {
  id: string;
  name: string;
  items: Array<{ key: string; safety: boolean; kind: string }>;
}

/** Records every safety-critical item but the ones named as OK through the API (set-up, not the journey). */
async function recordSafetyItemsExcept(request: APIRequestContext, shopId: string, jobId: string, checklistId: string, template: Template, except: string[]) {
  for (const item of template.items.filter((i) => i.safety && !except.includes(i.key))) {
    const body = item.kind === 'tyre_date' ? { result: 'ok', tyres: [{ position: 'Front', code: 'DOT 8K4P 2324' }] } : item.kind === 'measure' ? { result: 'ok', value: 4.5 } : { result: 'ok' };
    const res = await request.put(`/api/shops/${shopId}/jobs/${jobId}/checklists/${checklistId}/items/${item.key}`, { headers: writeHeaders, data: body });
    expect(res.status(), `${item.key}: ${await res.text()}`).toBe(200);
  }
}

test('a stored vehicle goes through recommissioning: readings, parts by an old number, a failed brake item blocks hand-over until fixed, then it is handed over', async ({ page, browser }) => {
  test.setTimeout(240_000);
  const shop = await createTestShop({ roles: ['owner', 'mechanic'] });
  const shopId = shop.shop.id;
  const owner = userWithRole(shop, 'owner');
  const mechanic = userWithRole(shop, 'mechanic');
  await signIn(page.request, owner.email, shop.password);

  // Set-up through the API: the shop works in bar; an old caliper seal number superseded by a new
  // one that is in stock; a part with none in stock; a customer's vehicle laid up for years.
  expect((await page.request.patch(`/api/shops/${shopId}/settings`, { headers: writeHeaders, data: { pressureUnit: 'bar' } })).status()).toBe(200);
  const oldSeal = await addPart(page.request, shopId, { number: '44-1180', description: 'Caliper seal kit (early)' });
  const newSeal = await addPart(page.request, shopId, { number: '44-2207', description: 'Caliper seal kit' });
  await replacedBy(page.request, shopId, oldSeal, newSeal);
  await addPart(page.request, shopId, { number: '61-0207', description: 'Front brake hose' });
  const bin = await addBin(page.request, shopId, 'BR-02', 'Brake shelf');
  await receive(page.request, shopId, { partId: newSeal.id, binId: bin.id, condition: 'new', quantity: 4, unitCostMinor: 1250 });
  const vehicleRes = await page.request.post(`/api/shops/${shopId}/vehicles`, { headers: writeHeaders, data: { kind: 'customer', marque: 'Velmark', model: 'Heron 250', year: 1962, frameNumber: 'VH 10442', notes: 'Laid up in a dry barn since 2011.' } });
  expect(vehicleRes.status(), await vehicleRes.text()).toBe(201);
  const vehicle = (await vehicleRes.json()) as { id: string };
  const templates = ((await (await page.request.get(`/api/shops/${shopId}/checklist-templates`)).json()) as { templates: Template[] }).templates;
  const recommissioning = templates.find((t) => t.name.startsWith('Recommissioning'))!;
  const jobRes = await page.request.post(`/api/shops/${shopId}/jobs`, { headers: writeHeaders, data: { vehicleId: vehicle.id, title: 'Recommission after storage', customerRequest: 'Laid up since 2011; make it safe to ride again.', templateIds: [recommissioning.id] } });
  expect(jobRes.status(), await jobRes.text()).toBe(201);
  const job = (await jobRes.json()) as { id: string; number: number; checklists: Array<{ id: string }> };
  const checklistId = job.checklists[0]!.id;

  // The owner gives the job to the mechanic.
  await page.setViewportSize({ width: 1280, height: 900 });
  await page.goto(`/shops/${shopId}/jobs/${job.id}`);
  await page.getByRole('button', { name: 'Change who works on it' }).click();
  const assign = page.getByRole('dialog', { name: `Who works on job ${job.number}` });
  await assign.getByRole('checkbox', { name: new RegExp(mechanic.name) }).check();
  await assign.getByRole('button', { name: 'Save' }).click();
  await expect(assign).toBeHidden();
  await expect(page.getByRole('region', { name: 'The job' }).getByText(mechanic.name)).toBeVisible();
  await page.getByRole('button', { name: 'Edit the job' }).click();
  const edit = page.getByRole('dialog', { name: `Edit job ${job.number}` });
  await edit.getByLabel('Notes').fill('Customer keeps the old seals.');
  await edit.getByRole('button', { name: 'Save' }).click();
  await expect(edit).toBeHidden();
  await expect(page.getByText('Customer keeps the old seals.')).toBeVisible();

  // Everything safety-critical but the brakes' hydraulics is checked and fine (set-up).
  await recordSafetyItemsExcept(page.request, shopId, job.id, checklistId, recommissioning, ['brake-hydraulics']);

  // The mechanic, at the bench on a tablet.
  const context = await browser.newContext({ viewport: { width: 820, height: 1180 } });
  const tablet = await context.newPage();
  await signIn(tablet.request, mechanic.email, shop.password);
  await tablet.goto(`/shops/${shopId}/jobs?view=mine`);
  await expect(tablet.getByRole('heading', { level: 1, name: 'My jobs' })).toBeVisible();
  await tablet.getByRole('link', { name: /Recommission after storage/ }).click();
  await expect(tablet.getByRole('heading', { level: 1, name: /Recommission after storage/ })).toBeVisible();
  await tablet.getByRole('button', { name: 'Start work' }).click();
  await expect(tablet.getByRole('region', { name: 'The job' }).getByText('In progress')).toBeVisible();

  // Compression entered in bar (the shop's unit), stored in kPa, shown back in bar.
  await tablet.getByRole('button', { name: 'Record: Compression per cylinder' }).click();
  const compression = tablet.getByRole('listitem').filter({ has: tablet.getByRole('heading', { name: /Compression per cylinder/ }) });
  await compression.getByLabel('Cylinder 1').fill('9.5');
  await compression.getByLabel('Cylinder 2').fill('9.2');
  await compression.getByLabel('OK', { exact: true }).check();
  await compression.getByRole('button', { name: 'Save' }).click();
  await expect(compression.getByText(/#1 9\.5\u00a0bar, #2 9\.2\u00a0bar/)).toBeVisible();

  // The calipers are seized: fail the item.
  await tablet.getByRole('button', { name: 'Record: Calipers, master cylinders and hoses: no seizing, no leaks' }).click();
  const hydraulics = tablet.getByRole('listitem').filter({ has: tablet.getByRole('heading', { name: /Calipers, master cylinders and hoses/ }) });
  await expect(hydraulics.getByRole('note', { name: /Safety caution: Brake fluids do not mix/ })).toBeVisible();
  await hydraulics.getByLabel('Fail', { exact: true }).check();
  await hydraulics.getByLabel('Note').fill('Both front calipers seized; seals perished.');
  await hydraulics.getByRole('button', { name: 'Save' }).click();
  const safety = tablet.getByRole('region', { name: 'Safety-critical items' });
  await expect(safety.getByText(/Calipers, master cylinders and hoses: no seizing, no leaks/)).toBeVisible();

  // Seals found through the old number: the lookup offers the kit that replaces it, from its bin.
  await tablet.getByLabel('Find a part', { exact: true }).fill('44-1180');
  await tablet.getByLabel('Quantity', { exact: true }).fill('2');
  const options = tablet.getByRole('list', { name: 'Parts that can fill it' });
  await expect(options.getByText('replaces 44-1180')).toBeVisible();
  await tablet.getByRole('region', { name: 'Parts' }).screenshot({ path: '/tmp/job-parts-finder-820.png' });
  await expectNoSeriousViolations(tablet, 'job page with lookup options');
  await options.getByRole('button', { name: 'Hold 2 × 44-2207 from BR-02 for this job' }).click();
  await expect(tablet.getByText('Held 2 × 44-2207 from BR-02 for this job.')).toBeVisible();
  await tablet.getByRole('button', { name: 'Issue 2 × 44-2207 to this job' }).click();
  const issued = tablet.getByRole('table');
  await expect(issued.getByText('44-2207')).toBeVisible();
  await expect(issued.getByText('£25.00')).toBeVisible();

  // A hose that is not in stock becomes a special order for the job.
  await tablet.getByLabel('Find a part', { exact: true }).fill('61-0207');
  await tablet.getByLabel('Quantity', { exact: true }).fill('1');
  await expect(options.getByText('None free in stock.')).toBeVisible();
  await options.getByRole('button', { name: 'Special order 1 × 61-0207 for this job' }).click();
  await expect(tablet.getByRole('region', { name: 'Parts' }).getByText(/Front brake hose — to be ordered/)).toBeVisible();

  // A photo of the seized caliper.
  await tablet.getByLabel('Caption (optional)').fill('Seized front caliper');
  await tablet.getByLabel('Photo files').setInputFiles({ name: 'caliper.png', mimeType: 'image/png', buffer: png });
  await expect(tablet.getByRole('img', { name: 'Seized front caliper' })).toBeVisible();

  // The owner tries to hand the vehicle back: refused while the brake item is failed.
  await page.goto(`/shops/${shopId}/vehicles/${vehicle.id}`);
  await page.getByRole('button', { name: 'Hand over' }).click();
  const handOver = page.getByRole('dialog', { name: 'Hand over?' });
  await handOver.getByRole('button', { name: 'Hand over' }).click();
  await expect(handOver.getByText(/cannot be “Handed over” yet/)).toBeVisible();
  await expect(handOver.getByText(/Calipers, master cylinders and hoses/)).toBeVisible();
  await handOver.getByRole('button', { name: 'Cancel' }).click();

  // The mechanic rebuilds the calipers, records it, books the time and finishes the job.
  await tablet.getByRole('button', { name: 'Change: Calipers, master cylinders and hoses: no seizing, no leaks' }).click();
  await hydraulics.getByLabel('OK', { exact: true }).check();
  await hydraulics.getByLabel('Note').fill('Calipers rebuilt with new seals; fluid renewed, no leaks.');
  await hydraulics.getByLabel('Photo of this item').selectOption({ label: 'Seized front caliper' });
  await hydraulics.getByRole('button', { name: 'Save' }).click();
  await expect(tablet.getByRole('region', { name: 'Safety-critical items' }).getByText(/Calipers, master cylinders and hoses/)).toBeHidden();
  await expect(hydraulics.getByRole('link', { name: 'Photo of this item: Seized front caliper' })).toBeVisible();
  await tablet.getByLabel('Hours').fill('1.5');
  await tablet.getByLabel('What was done').fill('Rebuilt both front calipers');
  await tablet.getByRole('button', { name: 'Book my time' }).click();
  await expect(tablet.getByText('Rebuilt both front calipers')).toBeVisible();
  await tablet.getByRole('button', { name: 'Mark done' }).click();
  await expect(tablet.getByRole('region', { name: 'The job' }).getByText('Done', { exact: true })).toBeVisible();

  // The job's cost: 2 × 12.50 in parts, 1.5 h at the default 60.00 an hour.
  const cost = tablet.getByRole('region', { name: 'Cost so far' });
  await expect(cost.getByText('£25.00')).toBeVisible();
  await expect(cost.getByText('£90.00')).toBeVisible();
  await expect(cost.getByText('£115.00')).toBeVisible();
  await tablet.screenshot({ path: '/tmp/recommissioning-job-820.png', fullPage: true });

  // The job sheet is there to print.
  const sheetHref = await tablet.getByRole('link', { name: 'Print the job sheet (PDF)' }).getAttribute('href');
  const sheet = await tablet.request.get(sheetHref!);
  expect(sheet.status()).toBe(200);
  expect(sheet.headers()['content-type']).toBe('application/pdf');
  await context.close();

  // Now the owner hands it over.
  await page.reload();
  await page.getByRole('button', { name: 'Hand over' }).click();
  await page.getByRole('dialog', { name: 'Hand over?' }).getByRole('button', { name: 'Hand over' }).click();
  await expect(page.getByRole('region', { name: 'Status' }).getByText('Handed over')).toBeVisible();
});

test('a shop-stock vehicle shows its total cost and margin to the owner, not to a mechanic', async ({ page, browser }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner', 'mechanic'] });
  const shopId = shop.shop.id;
  const mechanic = userWithRole(shop, 'mechanic');
  await signIn(page.request, userWithRole(shop, 'owner').email, shop.password);
  const vehicleRes = await page.request.post(`/api/shops/${shopId}/vehicles`, { headers: writeHeaders, data: { kind: 'shop_stock', marque: 'Corran', model: 'Tern 350', year: 1967, acquisitionCostMinor: 180_000, askingPriceMinor: 250_000 } });
  expect(vehicleRes.status(), await vehicleRes.text()).toBe(201);
  const vehicle = (await vehicleRes.json()) as { id: string };
  const jobRes = await page.request.post(`/api/shops/${shopId}/jobs`, { headers: writeHeaders, data: { vehicleId: vehicle.id, title: 'Pre-sale service', customerRequest: '', assigneeIds: [mechanic.id] } });
  const job = (await jobRes.json()) as { id: string };
  const labour = await page.request.post(`/api/shops/${shopId}/jobs/${job.id}/labour`, { headers: writeHeaders, data: { userId: mechanic.id, workedOn: '2026-01-15', minutes: 90, description: 'Service' } });
  expect(labour.status(), await labour.text()).toBe(201);

  await page.setViewportSize({ width: 820, height: 1180 });
  await page.goto(`/shops/${shopId}/vehicles/${vehicle.id}`);
  const costs = page.getByRole('region', { name: 'Cost and margin' });
  // 1,800.00 + 90.00 = 1,890.00 against 2,500.00: 610.00, 24.4 % of the asking price.
  await expect(costs.getByText('£1,890.00')).toBeVisible();
  await expect(costs.getByText('£610.00')).toBeVisible();
  await expect(costs.getByText('(24.4 %)')).toBeVisible();
  await costs.screenshot({ path: '/tmp/vehicle-costs-820.png' });
  await expectNoSeriousViolations(page, 'vehicle page with cost and margin');

  // On a phone the job page and the vehicle page fit the width (nothing scrolls sideways).
  await page.setViewportSize({ width: 390, height: 844 });
  await expect(costs.getByText('£610.00')).toBeVisible();
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  await page.goto(`/shops/${shopId}/jobs/${job.id}`);
  await page.getByLabel('Find a part', { exact: true }).fill('zz');
  await expect(page.getByRole('region', { name: 'Cost so far' }).getByText('£90.00').first()).toBeVisible();
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  await page.screenshot({ path: '/tmp/job-page-390.png', fullPage: true });

  const context = await browser.newContext({ viewport: { width: 820, height: 1180 } });
  const tablet = await context.newPage();
  await signIn(tablet.request, mechanic.email, shop.password);
  await tablet.goto(`/shops/${shopId}/vehicles/${vehicle.id}`);
  await expect(tablet.getByRole('heading', { level: 1, name: /Corran Tern 350/ })).toBeVisible();
  await expect(tablet.getByRole('region', { name: 'Cost and margin' })).toHaveCount(0);
  await expect(tablet.getByText('Acquisition cost')).toHaveCount(0);
  await expect(tablet.getByText('£1,800.00')).toHaveCount(0);
  await context.close();
});
