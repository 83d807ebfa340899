import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { uniqueName, waitForMail, writeHeaders } from '../../fixtures/stack';
import { fakeStripeUrl } from '../billing/fake-stripe';
import { addBin, addPart, receive, signIn } from '../stock/stock-api';

async function expectNoSeriousViolations(page: Page, screen: string) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const serious = results.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(
    serious.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join(', ')})`),
    `${screen} has no serious accessibility violations`,
  ).toEqual([]);
}

// The journey (issue 12): an estimate approved by the customer from the e-mailed link (the
// estimates screens, built alongside), the work done on the job, its parts and labour become an
// invoice, the owner issues it, the customer pays by card on the (fake) Stripe checkout page, and
// the invoice shows paid once the signed webhook has arrived.
test('estimate → customer approval → job → invoice issued → card payment through the checkout page → invoice shows paid', async ({ page, browser }) => {
  test.setTimeout(150_000);
  const shop = await createTestShop({ roles: ['owner', 'mechanic'] });
  const shopId = shop.shop.id;
  const owner = userWithRole(shop, 'owner');
  const mechanic = userWithRole(shop, 'mechanic');
  await signIn(page.request, owner.email, shop.password);

  // Set-up through the API: a part in stock at 12.50, a customer's vehicle, a job with 2 parts issued and an hour's labour.
  const number = uniqueName('SL').replace(/\s+/g, '-').toUpperCase().slice(0, 20);
  const part = await addPart(page.request, shopId, { number, description: 'Fork seal pair' });
  const bin = await addBin(page.request, shopId, `S-${Date.now().toString(36).slice(-5)}`.toUpperCase(), 'Sales shelf');
  await receive(page.request, shopId, { partId: part.id, binId: bin.id, condition: 'new', quantity: 5, unitCostMinor: 1250 });
  const email = `${uniqueName('iris').replace(/\s+/g, '.').toLowerCase()}@wendale.test`;
  const customer = await page.request.post(`/api/shops/${shopId}/customers`, { headers: writeHeaders, data: { name: 'Iris Wendale', email } });
  expect(customer.status(), await customer.text()).toBe(201);
  const vehicle = await page.request.post(`/api/shops/${shopId}/vehicles`, {
    headers: writeHeaders,
    data: { kind: 'customer', customerId: (await customer.json()).id, marque: 'Halwick', model: 'Comet 500', year: 1958, frameNumber: 'HC 50213' },
  });
  expect(vehicle.status(), await vehicle.text()).toBe(201);
  const job = await page.request.post(`/api/shops/${shopId}/jobs`, { headers: writeHeaders, data: { vehicleId: (await vehicle.json()).id, title: 'Fork seals', customerRequest: 'Forks weep oil.', assigneeIds: [mechanic.id] } });
  expect(job.status(), await job.text()).toBe(201);
  const jobId = (await job.json()).id as string;

  await test.step('the customer approves the estimate from the e-mailed link, without an account', async () => {
    const estimate = await page.request.post(`/api/shops/${shopId}/estimates`, {
      headers: writeHeaders,
      data: { jobId, lines: [{ kind: 'part', partId: part.id, description: 'Fork seal pair', quantity: 2 }, { kind: 'labour', description: 'Replace fork seals', quantity: '1' }] },
    });
    expect(estimate.status(), await estimate.text()).toBe(201);
    const sent = await page.request.post(`/api/shops/${shopId}/estimates/${(await estimate.json()).id}/send`, { headers: writeHeaders, data: {} });
    expect(sent.status(), await sent.text()).toBeLessThan(300);
    const mail = await waitForMail(email, /^Estimate EST-/);
    const link = /(http\S+\/estimate-approval#[A-Za-z0-9_-]{43})/.exec(mail.text)?.[1];
    expect(link, mail.text).toBeTruthy();
    const phoneContext = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const phone = await phoneContext.newPage();
    await phone.goto(link!);
    // 2 × 17.50 + 1 h × 60.00 = 95.00 net; 20 % tax 19.00; 114.00 in all.
    await phone.getByRole('button', { name: 'Approve £114.00' }).click();
    await expect(phone.getByRole('status')).toContainText('the estimate is approved');
    await phoneContext.close();
  });

  // The work is done: the mechanic issues the parts and books the hour (through the API).
  expect((await page.request.post(`/api/shops/${shopId}/jobs/${jobId}/parts/issues`, { headers: writeHeaders, data: { partId: part.id, binId: bin.id, condition: 'new', quantity: 2 } })).status()).toBe(201);
  expect((await page.request.post(`/api/shops/${shopId}/jobs/${jobId}/labour`, { headers: writeHeaders, data: { userId: mechanic.id, workedOn: '2026-01-15', minutes: 60, description: 'Replaced fork seals' } })).status()).toBe(201);

  await page.setViewportSize({ width: 820, height: 1180 });

  await test.step('the job is invoiced from its page', async () => {
    await page.goto(`/shops/${shopId}/jobs/${jobId}`);
    await page.getByRole('button', { name: 'Invoice this job' }).click();
    await expect(page.getByRole('heading', { level: 1, name: 'Draft invoice' })).toBeVisible();
    // 12.50 + 40 % (the default markup) = 17.50 a seal pair; 1 h at 60.00. Net 95.00, tax 20 % 19.00, total 114.00.
    const lines = page.getByRole('table', { name: /Lines of/ });
    await expect(lines.getByRole('row', { name: /Fork seal pair/ })).toContainText('£17.50');
    await expect(lines.getByRole('row', { name: /Replaced fork seals/ })).toContainText('£60.00');
    const totals = page.getByRole('region', { name: 'Totals' });
    await expect(totals).toContainText('Tax at 20 % on £95.00');
    await expect(totals).toContainText('£114.00');
    await page.screenshot({ path: test.info().outputPath('draft-invoice-tablet.png'), fullPage: true });
    await expectNoSeriousViolations(page, 'draft invoice');
  });

  await test.step('the owner issues it after confirming', async () => {
    await page.getByRole('button', { name: 'Issue invoice' }).click();
    const dialog = page.getByRole('dialog', { name: 'Issue this invoice?' });
    await expect(dialog).toContainText('can no longer be changed');
    await dialog.getByRole('button', { name: 'Issue', exact: true }).click();
    await expect(page.getByRole('heading', { level: 1, name: /^Invoice INV-\d{5}$/ })).toBeVisible();
    await expect(page.getByRole('region', { name: 'Summary' }).getByText('Unpaid')).toBeVisible();
  });

  await test.step('the card payment goes through the checkout page and the invoice shows paid', async () => {
    await page.getByRole('button', { name: 'Take card payment' }).click();
    await expect(page).toHaveURL(new RegExp(`^${fakeStripeUrl}/checkout/`));
    await expect(page.getByText('£114.00').first()).toBeVisible();
    await page.getByRole('button', { name: 'Pay' }).click();
    await expect(page).toHaveURL(new RegExp(`/shops/${shopId}/sales/invoices/[^/?]+\\?paid=card$`));
    const summary = page.getByRole('region', { name: 'Summary' });
    await expect(summary.getByText('Paid', { exact: true }).first()).toBeVisible();
    await expect(page.getByRole('region', { name: 'Totals' })).toContainText('£0.00');
    await expect(page.getByRole('region', { name: 'Payments' }).getByText(/· Card/)).toBeVisible();
    await page.screenshot({ path: test.info().outputPath('paid-invoice-tablet.png'), fullPage: true });
    await expectNoSeriousViolations(page, 'paid invoice');
  });

  await test.step('the invoices list finds it among the paid ones', async () => {
    await page.goto(`/shops/${shopId}/sales/invoices`);
    await page.getByLabel('State').selectOption('paid');
    await expect(page.getByRole('row', { name: /Iris Wendale/ })).toBeVisible();
    await expectNoSeriousViolations(page, 'invoices list');
  });
});

test('a counter sale finds a part through the lookup, issues the stock and the invoice; the pricing rules screen is readable', async ({ page }) => {
  test.setTimeout(120_000);
  const shop = await createTestShop({ roles: ['owner'] });
  const shopId = shop.shop.id;
  await signIn(page.request, userWithRole(shop, 'owner').email, shop.password);
  const number = uniqueName('CS').replace(/\s+/g, '-').toUpperCase().slice(0, 20);
  const part = await addPart(page.request, shopId, { number, description: 'Spark plug cap' });
  const bin = await addBin(page.request, shopId, `C-${Date.now().toString(36).slice(-5)}`.toUpperCase(), 'Counter shelf');
  await receive(page.request, shopId, { partId: part.id, binId: bin.id, condition: 'new', quantity: 6, unitCostMinor: 400 });
  await page.setViewportSize({ width: 820, height: 1180 });

  await page.goto(`/shops/${shopId}/sales/counter`);
  await page.getByLabel('Part number or words').fill(number);
  await page.getByRole('button', { name: 'Look up' }).click();
  // 4.00 + 40 % = 5.60.
  await expect(page.getByText('Sell price £5.60')).toBeVisible();
  await page.getByRole('button', { name: new RegExp(`Add ${number} from`) }).click();
  await page.getByLabel(`Quantity of ${number}`).fill('9');
  await page.getByRole('button', { name: 'Complete sale and issue invoice' }).click();
  await expect(page.getByText(/Only 6 free/)).toBeVisible();
  await page.getByLabel(`Quantity of ${number}`).fill('3');
  await page.getByLabel('Customer name (optional)').fill('Jory Pendell');
  await page.screenshot({ path: test.info().outputPath('counter-sale-tablet.png'), fullPage: true });
  await expectNoSeriousViolations(page, 'counter sale');
  await page.getByRole('button', { name: 'Complete sale and issue invoice' }).click();
  await expect(page.getByRole('heading', { level: 1, name: /^Invoice INV-\d{5}$/ })).toBeVisible();
  // 3 × 5.60 = 16.80 + 20 % = 20.16.
  await expect(page.getByRole('region', { name: 'Totals' })).toContainText('£20.16');
  const stock = await page.request.get(`/api/shops/${shopId}/stock?partId=${part.id}`);
  expect(((await stock.json()) as { lines: Array<{ onHand: number }> }).lines[0]?.onHand).toBe(3);

  await page.getByRole('link', { name: 'Pricing rules' }).click();
  await expect(page.getByRole('form', { name: 'Pricing rules' })).toBeVisible();
  await page.getByLabel('Default markup (%)').fill('50');
  await page.getByRole('button', { name: 'Save pricing rules' }).click();
  await expect(page.getByText('Pricing rules saved.')).toBeVisible();
  await page.screenshot({ path: test.info().outputPath('pricing-rules-tablet.png'), fullPage: true });
  await expectNoSeriousViolations(page, 'pricing rules');
});
