import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { renderHook, waitFor } from '@testing-library/react';
import type { ReactNode } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, shopA } from '../testing/fake-api';
import { useFormatMoney } from './shop-settings';

afterEach(() => vi.unstubAllGlobals());

const settings = { name: 'Harbour Works', address: '', currency: 'EUR', distanceUnit: 'km', pressureUnit: 'bar', taxRatePercent: 20, labourRateMinorPerHour: 6000, serviceLevel: 0.95, orderingCostMinor: 2500, holdingCostRatePercent: 25, labelSheetFormat: 'a4-3x8' };

function wrapper({ children }: { children: ReactNode }) {
  return <QueryClientProvider client={new QueryClient({ defaultOptions: { queries: { retry: false } } })}>{children}</QueryClientProvider>;
}

describe('useFormatMoney', () => {
  it("shows the plain amount until the settings arrive, then the shop's currency", async () => {
    installFakeApi({ [`GET /shops/${shopA}/settings`]: () => ({ body: settings }) });
    const { result } = renderHook(() => useFormatMoney(shopA), { wrapper });
    expect(result.current(123456)).toBe('1234.56');
    await waitFor(() => expect(result.current(123456)).toBe('€1,234.56'));
  });
});
