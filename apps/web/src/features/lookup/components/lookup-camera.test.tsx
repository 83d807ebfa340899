import type { PartSearchResult } from '@tappet/contracts';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, ownerOfA, shopA, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

// The camera on the lookup screen, with the camera APIs mocked (getUserMedia, the video element,
// the browser's BarcodeDetector).
const slow = { timeout: 5000 };
const partId = 'aaaaaaaa-0000-4000-8000-00000000000a';
const result = (overrides: Partial<PartSearchResult> = {}): PartSearchResult => ({
  id: partId,
  number: 'HW-1042-B',
  description: 'Gearbox mainshaft bearing',
  origin: 'genuine',
  category: 'Gearbox',
  status: 'available',
  match: 'exact',
  reason: 'the number',
  ...overrides,
});

function install(answer: (q: string) => PartSearchResult[]) {
  const base: Record<string, (r: RecordedRequest) => { status?: number; body?: unknown }> = {
    'GET /me': () => ({ body: ownerOfA() }),
    [`GET /shops/${shopA}`]: () => ({ body: { id: shopA, name: 'Harbour Works', slug: 'harbour-works', createdAt: '2024-03-01T09:00:00.000Z' } }),
    [`GET /shops/${shopA}/parts/search`]: (r) => ({ body: { results: answer(new URLSearchParams(r.path.split('?')[1]).get('q') ?? '') } }),
    [`GET /shops/${shopA}/parts`]: () => ({ body: { items: [], total: 0, page: 1, pageSize: 1, categories: [] } }),
  };
  const routes = new Proxy(base, { get: (target, key) => (typeof key === 'string' ? (target[key] ?? target[key.split('?')[0] ?? key]) : undefined) });
  return installFakeApi(routes);
}

function mockCamera(getUserMedia: () => Promise<MediaStream>) {
  Object.defineProperty(navigator, 'mediaDevices', { configurable: true, value: { getUserMedia: vi.fn(getUserMedia) } });
}
const stream = () => ({ getTracks: () => [{ stop: () => {} }] }) as unknown as MediaStream;
function mockDetector(rawValue: string) {
  const detect = vi.fn(async () => [{ rawValue, format: 'code_128' }]);
  vi.stubGlobal('BarcodeDetector', Object.assign(vi.fn(function () { return { detect }; }), { getSupportedFormats: async () => ['code_128', 'qr_code', 'ean_13'] }));
}

beforeEach(() => {
  localStorage.clear();
  vi.spyOn(HTMLMediaElement.prototype, 'play').mockResolvedValue(undefined);
});
afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
  Reflect.deleteProperty(navigator, 'mediaDevices');
});

describe('scanning with the camera on the lookup screen', () => {
  it('fills the search with the code read and opens an exact hit', async () => {
    install((q) => (q ? [result()] : []));
    mockCamera(async () => stream());
    mockDetector('HW-1042-B');
    const { router } = renderApp(`/shops/${shopA}/lookup`);
    const field = await screen.findByRole('combobox', { name: 'Look up a part' }, slow);
    await userEvent.setup().click(screen.getByRole('button', { name: 'Scan with the camera' }));
    await waitFor(() => expect(field).toHaveValue('HW-1042-B'), slow);
    await waitFor(() => expect(router.state.location.pathname).toBe(`/shops/${shopA}/catalogue/${partId}`), slow);
  }, 20_000);

  it('shows the results, without opening anything, when the code is not an exact hit', async () => {
    install((q) => (q ? [result({ match: 'fuzzy', reason: 'close to HW-1042-B' })] : []));
    mockCamera(async () => stream());
    mockDetector('HW-1024-B');
    const { router } = renderApp(`/shops/${shopA}/lookup`);
    const field = await screen.findByRole('combobox', { name: 'Look up a part' }, slow);
    await userEvent.setup().click(screen.getByRole('button', { name: 'Scan with the camera' }));
    await waitFor(() => expect(field).toHaveValue('HW-1024-B'), slow);
    expect(await screen.findByRole('listbox', { name: 'Lookup results' }, slow)).toHaveTextContent('close to HW-1042-B');
    expect(router.state.location.pathname).toBe(`/shops/${shopA}/lookup`);
    await waitFor(() => expect(field).toHaveFocus(), slow);
  }, 20_000);

  it('when the camera is refused, says so and takes the typed number instead', async () => {
    const user = userEvent.setup();
    install((q) => (q ? [result({ match: 'partial', reason: 'part of the number' })] : []));
    mockCamera(async () => {
      throw Object.assign(new Error('denied'), { name: 'NotAllowedError' });
    });
    renderApp(`/shops/${shopA}/lookup`);
    const field = await screen.findByRole('combobox', { name: 'Look up a part' }, slow);
    await user.click(screen.getByRole('button', { name: 'Scan with the camera' }));
    const dialog = await screen.findByRole('dialog', { name: 'Scan a part number' });
    expect(await screen.findByRole('alert')).toHaveTextContent('Camera access was refused');
    await user.type(screen.getByLabelText('Or type the number'), '1042{Enter}');
    expect(dialog).not.toBeInTheDocument();
    expect(field).toHaveValue('1042');
    expect(await screen.findByRole('listbox', { name: 'Lookup results' }, slow)).toHaveTextContent('part of the number');
  }, 20_000);
});
