import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { uniqueName, waitForMail, writeHeaders } from '../../fixtures/stack';
import { addBin, addPart, receive, signIn } from '../stock/stock-api';

/** Where screenshots for a look by eye go: E2E_SHOTS_DIR when set (outside the shared results folder). */
const shot = (testInfo: { outputPath: (name: string) => string }, name: string) => (process.env['E2E_SHOTS_DIR'] ? `${process.env['E2E_SHOTS_DIR']}/${name}` : testInfo.outputPath(name));

async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

test('the owner builds and sends an estimate; the customer approves it from the e-mailed link; the job shows the approved amount', async ({ page, browser }, testInfo) => {
  test.setTimeout(180_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  const owner = userWithRole(shop, 'owner');
  await signIn(page.request, owner.email, shop.password);

  // Set-up through the API: a part costing 12.50 (sells at 17.50 under the default 40 % markup),
  // a customer with an e-mail address, their vehicle and a job on it.
  const number = uniqueName('ES').replace(/\s+/g, '-').toUpperCase().slice(0, 20);
  const part = await addPart(page.request, shopId, { number, description: 'Brake shoe set' });
  const bin = await addBin(page.request, shopId, `E-${Date.now().toString(36).slice(-5)}`.toUpperCase(), 'Estimates shelf');
  await receive(page.request, shopId, { partId: part.id, binId: bin.id, condition: 'new', quantity: 4, unitCostMinor: 1250 });
  const email = `${uniqueName('rowan').replace(/\s+/g, '.').toLowerCase()}@estimate-customer.test`;
  const customer = await page.request.post(`/api/shops/${shopId}/customers`, { headers: writeHeaders, data: { name: 'Rowan Tillery', email } });
  expect(customer.status(), await customer.text()).toBe(201);
  const vehicle = await page.request.post(`/api/shops/${shopId}/vehicles`, { headers: writeHeaders, data: { kind: 'customer', marque: 'Mereford', model: 'Heron 500', year: 1959, customerId: (await customer.json()).id } });
  expect(vehicle.status(), await vehicle.text()).toBe(201);
  const job = await page.request.post(`/api/shops/${shopId}/jobs`, { headers: writeHeaders, data: { vehicleId: (await vehicle.json()).id, title: 'Reline the rear brakes', customerRequest: 'Brakes feel weak', assigneeIds: [], templateIds: [] } });
  expect(job.status(), await job.text()).toBe(201);
  const jobId = (await job.json()).id as string;

  // The owner builds the estimate on the job page, on a workshop tablet.
  await page.setViewportSize({ width: 820, height: 1180 });
  await page.goto(`/shops/${shopId}/jobs/${jobId}`);
  const panel = page.getByRole('region', { name: 'Estimate and approval' });
  await expect(panel.getByText('No estimate for this job yet.')).toBeVisible();
  await panel.getByRole('button', { name: 'Start an estimate' }).click();
  const form = panel.getByRole('form', { name: 'Add a line' });
  await form.getByRole('button', { name: 'Add the line' }).click();
  await expect(form.getByText('Find the part and pick it from the list.')).toBeVisible();
  await form.getByLabel('Find the part').fill(number);
  await form.getByRole('button', { name: new RegExp(number) }).click();
  await form.getByLabel('Quantity').fill('2');
  await form.getByRole('button', { name: 'Add the line' }).click();
  await expect(panel.getByRole('cell', { name: new RegExp(`^${number}\\s*Brake shoe set$`) })).toBeVisible();
  await form.getByLabel('Kind of line').selectOption('labour');
  await form.getByLabel('Description').fill('Strip, reline and adjust');
  await form.getByLabel('Hours').fill('1.5');
  await form.getByRole('button', { name: 'Add the line' }).click();
  // 2 × 17.50 + 1.5 h × 60.00 = 125.00 net; 20 % tax 25.00; 150.00 in all.
  await expect(panel.getByTestId('estimate-total')).toHaveText('£150.00');
  await page.screenshot({ path: shot(testInfo, 'estimate-builder-tablet.png'), fullPage: true });
  await expectNoSeriousViolations(page, 'job page with an estimate');

  await panel.getByRole('button', { name: 'Send to the customer' }).click();
  const dialog = page.getByRole('dialog', { name: /Send EST-/ });
  await expect(dialog.getByLabel('Customer’s e-mail address')).toHaveValue(email);
  await dialog.getByRole('button', { name: 'Send' }).click();
  await expect(panel.getByTestId('estimate-status')).toHaveText('Waiting for the customer');

  // The customer opens the link from the e-mail on a phone, without an account.
  const mail = await waitForMail(email, /^Estimate EST-/);
  const link = /(http\S+\/estimate-approval#[A-Za-z0-9_-]{43})/.exec(mail.text)?.[1];
  expect(link, mail.text).toBeTruthy();
  const phoneContext = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const phone = await phoneContext.newPage();
  await phone.goto(link!);
  await expect(phone.getByRole('heading', { level: 1, name: /Estimate EST-/ })).toBeVisible();
  await expect(phone.getByTestId('public-total')).toHaveText('£150.00');
  await expect(phone.getByText('Tax at 20 %')).toBeVisible();
  await expect(phone.getByRole('link', { name: 'Jobs' })).toHaveCount(0); // no app chrome
  await phone.screenshot({ path: shot(testInfo, 'estimate-approval-phone.png'), fullPage: true });
  await expectNoSeriousViolations(phone, 'public approval page');
  await phone.getByRole('button', { name: 'Approve £150.00' }).click();
  await expect(phone.getByRole('status')).toContainText('the estimate is approved');
  await expect(phone.getByRole('status')).toContainText('£150.00');

  // Opening the link again is refused: it worked once.
  await phone.reload();
  await expect(phone.getByRole('alert')).toContainText('already been used');
  await phoneContext.close();

  // Back on the job: the approved amount.
  await page.reload();
  await expect(panel.getByTestId('approved-amount')).toContainText('£150.00');
  await expect(panel.getByTestId('estimate-status')).toHaveText('Approved');

  // The work as estimated: 2 shoes issued and 90 minutes of labour; still within the approval.
  const issued = await page.request.post(`/api/shops/${shopId}/jobs/${jobId}/parts/issues`, { headers: writeHeaders, data: { partId: part.id, binId: bin.id, condition: 'new', quantity: 2 } });
  expect(issued.status(), await issued.text()).toBeLessThan(300);
  const labour = await page.request.post(`/api/shops/${shopId}/jobs/${jobId}/labour`, { headers: writeHeaders, data: { userId: owner.id, workedOn: new Date().toISOString().slice(0, 10), minutes: 90, description: 'Reline and adjust' } });
  expect(labour.status(), await labour.text()).toBeLessThan(300);
  await page.reload();
  await expect(panel.getByText('£150.00').first()).toBeVisible();
  await expect(panel.getByText(/Over the approved amount/)).toHaveCount(0);
  // One more shoe set beyond the estimate: the job page asks for a revised estimate.
  const more = await page.request.post(`/api/shops/${shopId}/jobs/${jobId}/parts/issues`, { headers: writeHeaders, data: { partId: part.id, binId: bin.id, condition: 'new', quantity: 1 } });
  expect(more.status(), await more.text()).toBeLessThan(300);
  await page.reload();
  await expect(panel.getByRole('alert')).toContainText('Over the approved amount — send a revised estimate');

  // The sales screens exist: the job goes on to its invoice.
  await page.getByRole('button', { name: 'Invoice this job' }).click();
  await expect(page).toHaveURL(/\/sales\/invoices\//);

  // The sales reports screen, for a look.
  await page.goto(`/shops/${shopId}/sales/reports`);
  await expect(page.getByRole('heading', { level: 1, name: 'Sales reports' })).toBeVisible();
  await expect(page.getByRole('heading', { name: 'Gross margin' })).toBeVisible();
  await expectNoSeriousViolations(page, 'sales reports');
  await page.screenshot({ path: shot(testInfo, 'sales-reports-tablet.png'), fullPage: true });
});

test('the owner agrees consignment terms, settles the sale, prints the settlement and records the payout', async ({ page }, testInfo) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  const owner = userWithRole(shop, 'owner');
  await signIn(page.request, owner.email, shop.password);
  const customer = await page.request.post(`/api/shops/${shopId}/customers`, { headers: writeHeaders, data: { name: 'Marit Solvang' } });
  expect(customer.status(), await customer.text()).toBe(201);
  const vehicle = await page.request.post(`/api/shops/${shopId}/vehicles`, { headers: writeHeaders, data: { kind: 'consignment', marque: 'Ashcombe', model: 'Kestrel 750', year: 1971, customerId: (await customer.json()).id, askingPriceMinor: 1_300_000 } });
  expect(vehicle.status(), await vehicle.text()).toBe(201);

  await page.setViewportSize({ width: 820, height: 1180 });
  await page.goto(`/shops/${shopId}/consignment`);
  await expect(page.getByRole('heading', { level: 1, name: 'Consignment' })).toBeVisible();
  await expect(page.getByRole('row', { name: /Ashcombe Kestrel 750/ })).toContainText('ArrivedMarit SolvangNot recorded yetNot settled yet');
  await page.getByRole('link', { name: '1971 Ashcombe Kestrel 750' }).click();
  await expect(page.getByRole('heading', { level: 1, name: '1971 Ashcombe Kestrel 750' })).toBeVisible();

  const terms = page.getByRole('form', { name: 'Consignment terms' });
  await terms.getByRole('button', { name: 'Save the terms' }).click();
  await expect(terms.getByText('Give the commission percentage.')).toBeVisible();
  await terms.getByLabel('Commission (%)').fill('12.5');
  await terms.getByRole('button', { name: 'Save the terms' }).click();
  await expect(page.getByText(/Commission 12.5% of the sale price/)).toBeVisible();

  // Settling records the sale, so the vehicle must be ready first: the page says so and links to it.
  await expect(page.getByText('Settling records the vehicle as sold, so it must be ready first: it is “Arrived”.')).toBeVisible();
  await expect(page.getByRole('form', { name: 'Settle the sale' })).toHaveCount(0);
  const vehicleId = (await vehicle.json()).id as string;
  await expect(page.getByRole('link', { name: 'Move it on the vehicle’s page' })).toHaveAttribute('href', `/shops/${shopId}/vehicles/${vehicleId}`);
  for (const to of ['assessing', 'ready']) {
    const moved = await page.request.post(`/api/shops/${shopId}/vehicles/${vehicleId}/status`, { headers: writeHeaders, data: { to } });
    expect(moved.status(), await moved.text()).toBe(200);
  }
  await page.reload();

  const settle = page.getByRole('form', { name: 'Settle the sale' });
  await settle.getByLabel('Sale price').fill('12345.00');
  await settle.getByRole('button', { name: 'Settle the sale…' }).click();
  const confirm = page.getByRole('alertdialog', { name: 'Settle this sale?' });
  await expect(confirm).toContainText('The vehicle is recorded as sold on');
  await confirm.getByRole('button', { name: 'Settle', exact: true }).click();
  // 12 345.00 − 12.5 % (1 543.125 → 1 543.13, half away from zero: decision 015) = 10 801.87, no approved work.
  await expect(page.getByTestId('payout')).toHaveText('£10,801.87');
  await expectNoSeriousViolations(page, 'consignment settlement');
  expect((await (await page.request.get(`/api/shops/${shopId}/vehicles/${vehicleId}`)).json()).status).toBe('sold');

  const pdfHref = await page.getByRole('link', { name: 'Settlement PDF' }).getAttribute('href');
  const pdf = await page.request.get(pdfHref!);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()['content-type']).toBe('application/pdf');

  const payout = page.getByRole('form', { name: 'Record the payout' });
  await payout.getByRole('button', { name: 'Record the payout' }).click();
  await expect(payout.getByText(/Give the payment reference/)).toBeVisible();
  await payout.getByLabel('Payment reference').fill('ASH-KESTREL-1');
  await payout.getByRole('button', { name: 'Record the payout' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'ASH-KESTREL-1' })).toContainText('by bank transfer');
  await page.screenshot({ path: shot(testInfo, 'consignment-settlement-tablet.png'), fullPage: true });

  // The list shows the vehicle sold, settled and paid.
  await page.goto(`/shops/${shopId}/consignment`);
  const row = page.getByRole('row', { name: /Ashcombe Kestrel 750/ });
  await expect(row).toContainText('Sold');
  await expect(row).toContainText(/CS-\d{6} · payout £10,801\.87 · paid/);
});
