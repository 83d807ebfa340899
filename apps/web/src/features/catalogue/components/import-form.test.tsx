import type { ImportResult } from '@tappet/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { meFixture, shopA } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';
import { installCatalogueApi } from '../testing';

const slow = { timeout: 5000 };
afterEach(() => vi.unstubAllGlobals());

const badPreview: ImportResult = {
  kind: 'links',
  mode: 'preview',
  rows: 3,
  added: 1,
  changed: 0,
  unchanged: 0,
  sample: [{ row: 2, action: 'add', summary: '71-3456 replaced by 71-3457' }],
  errors: [
    { row: 3, column: 'kind', message: 'Use replaced_by, kit_contains or equivalent.' },
    { row: 4, column: 'quantity', message: 'The quantity must be more than 0.' },
  ],
  committed: false,
};
const goodPreview: ImportResult = { ...badPreview, added: 3, errors: [] };
const committed: ImportResult = { ...goodPreview, mode: 'commit', committed: true };

const csv = (text: string, name = 'links.csv') => new File([text], name, { type: 'text/csv' });

/** What the screen sent in each upload (the fake API does not read multipart bodies). */
function uploads(fetchMock: ReturnType<typeof installCatalogueApi>['fetchMock']) {
  return fetchMock.mock.calls
    .filter(([, init]) => init?.body instanceof FormData)
    .map(([, init]) => {
      const form = init!.body as FormData;
      const headers = init!.headers as Record<string, string>;
      return { kind: form.get('kind'), mode: form.get('mode'), file: (form.get('file') as File).name, contentType: headers['Content-Type'], csrf: headers['X-CSRF'] };
    });
}

describe('importing a CSV file', () => {
  it('lists every bad row, refuses to import until the file is fixed, then imports it', async () => {
    const user = userEvent.setup();
    let answer: ImportResult = badPreview;
    const { fetchMock } = installCatalogueApi({ [`POST /shops/${shopA}/imports`]: () => ({ body: answer }) });
    renderApp(`/shops/${shopA}/catalogue/import`);

    await user.click(await screen.findByRole('radio', { name: 'Links between numbers' }, slow));
    expect(screen.getByText(/from_number, kind, to_number/)).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Check file' }));
    expect(screen.getByLabelText('CSV file')).toHaveAccessibleDescription(/Choose a CSV file first\./);

    await user.upload(screen.getByLabelText('CSV file'), csv('from_number,kind,to_number\n'));
    await user.click(screen.getByRole('button', { name: 'Check file' }));
    const errors = await screen.findByRole('table', { name: /2 problems in the file/ });
    const rows = within(errors).getAllByRole('row').slice(1).map((r) => within(r).getAllByRole('cell').map((c) => c.textContent));
    expect(rows).toEqual([
      ['3', 'kind', 'Use replaced_by, kit_contains or equivalent.'],
      ['4', 'quantity', 'The quantity must be more than 0.'],
    ]);
    expect(screen.getByRole('button', { name: 'Import' })).toBeDisabled();
    expect(screen.getByRole('button', { name: 'Import' })).toHaveAccessibleDescription('Importing is possible once the file has no errors.');
    // The choices are kept for the next try.
    expect(screen.getByRole('radio', { name: 'Links between numbers' })).toBeChecked();

    answer = goodPreview;
    await user.upload(screen.getByLabelText('CSV file'), csv('from_number,kind,to_number\n', 'links-fixed.csv'));
    await user.click(screen.getByRole('button', { name: 'Check file' }));
    const importButton = await screen.findByRole('button', { name: 'Import 3 rows' });
    expect(importButton).toBeEnabled();
    expect(screen.queryByRole('table', { name: /problems in the file/ })).not.toBeInTheDocument();

    answer = committed;
    await user.click(importButton);
    expect(await screen.findByText(/3 rows imported: 3 added, 0 changed, 0 unchanged\./)).toBeInTheDocument();
    expect(uploads(fetchMock)).toEqual([
      { kind: 'links', mode: 'preview', file: 'links.csv', contentType: undefined, csrf: '1' },
      { kind: 'links', mode: 'preview', file: 'links-fixed.csv', contentType: undefined, csrf: '1' },
      { kind: 'links', mode: 'commit', file: 'links-fixed.csv', contentType: undefined, csrf: '1' },
    ]);
  }, 20_000);

  it('keeps the file and kind when the upload is refused, and says why', async () => {
    const user = userEvent.setup();
    installCatalogueApi({
      [`POST /shops/${shopA}/imports`]: () => ({ status: 413, body: { error: { code: 'payload_too_large', message: 'The file is larger than 20 MB.' } } }),
    });
    renderApp(`/shops/${shopA}/catalogue/import`);
    await user.click(await screen.findByRole('radio', { name: 'Fitments' }, slow));
    await user.upload(screen.getByLabelText('CSV file'), csv('number,marque,model\n', 'fitments.csv'));
    await user.click(screen.getByRole('button', { name: 'Check file' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('The file is larger than 20 MB.');
    expect(screen.getByRole('radio', { name: 'Fitments' })).toBeChecked();
    expect((screen.getByLabelText('CSV file') as HTMLInputElement).files?.[0]?.name).toBe('fitments.csv');
    await waitFor(() => expect(screen.getByRole('button', { name: 'Check file' })).toBeEnabled());
  }, 20_000);

  it('tells a viewer that importing is for the owner and the buyer', async () => {
    const viewer = meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role: 'viewer', spendingLimitMinor: null }]);
    installCatalogueApi({}, viewer);
    renderApp(`/shops/${shopA}/catalogue/import`);
    expect(await screen.findByText('Importing is for the owner and the parts buyer', {}, slow)).toBeInTheDocument();
    expect(screen.queryByLabelText('CSV file')).not.toBeInTheDocument();
  }, 20_000);

  it('shows upload progress for a large file, sent with the CSRF header and the form fields', async () => {
    const user = userEvent.setup();
    installCatalogueApi({});
    const sent: Array<{ method: string; url: string; headers: Record<string, string>; body: FormData }> = [];
    let finish: () => void = () => {};
    class FakeXhr {
      status = 0;
      responseText = '';
      upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
      onload: (() => void) | null = null;
      onerror: (() => void) | null = null;
      private request = { method: '', url: '', headers: {} as Record<string, string> };
      open(method: string, url: string) {
        this.request.method = method;
        this.request.url = url;
      }
      setRequestHeader(name: string, value: string) {
        this.request.headers[name] = value;
      }
      send(body: FormData) {
        sent.push({ ...this.request, body });
        const total = (body.get('file') as File).size;
        this.upload.onprogress?.({ lengthComputable: true, loaded: Math.floor(total / 2), total });
        finish = () => {
          this.status = 200;
          this.responseText = JSON.stringify(goodPreview);
          this.onload?.();
        };
      }
    }
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    renderApp(`/shops/${shopA}/catalogue/import`);
    const big = 'number,description\n' + '55-001,Fork seal\n'.repeat(20_000);
    await user.upload(await screen.findByLabelText('CSV file', {}, slow), csv(big, 'big.csv'));
    await user.click(screen.getByRole('button', { name: 'Check file' }));
    const bar = await screen.findByRole('progressbar', { name: 'Upload of big.csv' });
    expect(bar).toHaveAttribute('value', String(Math.floor(big.length / 2)));
    expect(sent[0]).toMatchObject({ method: 'POST', url: `/api/shops/${shopA}/imports`, headers: { 'X-CSRF': '1' } });
    expect(sent[0]?.headers['Content-Type']).toBeUndefined();
    expect([sent[0]?.body.get('kind'), sent[0]?.body.get('mode')]).toEqual(['parts', 'preview']);
    finish();
    expect(await screen.findByRole('button', { name: 'Import 3 rows' })).toBeEnabled();
  }, 20_000);
});
