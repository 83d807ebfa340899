import type { QueryClient } from '@tanstack/react-query';
import type { ComponentType } from 'react';
import { createBrowserRouter, redirect, type LoaderFunction, type RouteObject } from 'react-router-dom';

type RouterFactory = (routes: RouteObject[]) => ReturnType<typeof createBrowserRouter>;
import { paths } from '../config/paths';
import { lineageQueryOptions } from '../features/catalogue/api/get-lineage';
import { partQueryOptions } from '../features/catalogue/api/get-part';
import { homeHref, meQueryOptions } from '../lib/auth';
import * as appLayout from './routes/app/layout';
import * as shopLayout from './routes/app/shop/layout';
import { RootErrorBoundary, RootFallback, RootLayout } from './routes/root';

/** What a lazily loaded route module may export. */
export interface RouteModule {
  default: ComponentType;
  /** Given the QueryClient, returns the route's loader (it prefetches or redirects). */
  clientLoader?: (queryClient: QueryClient) => LoaderFunction;
  ErrorBoundary?: ComponentType;
}

/** Turns a route module into what React Router's `lazy` expects, wiring in the QueryClient. */
function load(queryClient: QueryClient, importer: () => Promise<RouteModule>) {
  return async () => {
    const { default: Component, clientLoader, ErrorBoundary } = await importer();
    return { Component, ...(clientLoader ? { loader: clientLoader(queryClient) } : {}), ...(ErrorBoundary ? { ErrorBoundary } : {}) };
  };
}

/**
 * The route table. Every screen is split into its own chunk and loaded when first visited, so
 * the first load carries only the frame. Tests pass a memory router factory.
 */
export function createAppRouter(queryClient: QueryClient, createRouter: RouterFactory = createBrowserRouter) {
  const routes: RouteObject[] = [
    {
      id: 'root',
      Component: RootLayout,
      ErrorBoundary: RootErrorBoundary,
      HydrateFallback: RootFallback,
      children: [
        {
          index: true,
          // Never shown for long: the loader always redirects.
          Component: RootFallback,
          loader: async () => {
            const me = await queryClient.ensureQueryData(meQueryOptions());
            return redirect(me ? homeHref(me) : paths.auth.signIn.getHref());
          },
        },
        { path: paths.auth.signIn.path, lazy: load(queryClient, () => import('./routes/auth/sign-in')) },
        { path: paths.auth.forgotPassword.path, lazy: load(queryClient, () => import('./routes/auth/forgot-password')) },
        { path: paths.auth.resetPassword.path, lazy: load(queryClient, () => import('./routes/auth/reset-password')) },
        { path: paths.auth.acceptInvitation.path, lazy: load(queryClient, () => import('./routes/auth/accept-invitation')) },
        { path: paths.auth.estimateApproval.path, lazy: load(queryClient, () => import('./routes/estimate-approval')) },
        {
          id: 'app',
          lazy: load(queryClient, async () => appLayout),
          children: [
            {
              path: paths.shop.home.path,
              lazy: load(queryClient, async () => shopLayout),
              children: [
                { index: true, lazy: load(queryClient, () => import('./routes/app/shop/home')) },
                { path: 'shop', lazy: load(queryClient, () => import('./routes/app/shop/settings')) },
                { path: 'staff', lazy: load(queryClient, () => import('./routes/app/shop/admin/staff')) },
                { path: 'audit-log', lazy: load(queryClient, () => import('./routes/app/shop/admin/audit-log')) },
                { path: 'api-keys', lazy: load(queryClient, () => import('./routes/app/shop/admin/api-keys')) },
                { path: 'billing', lazy: load(queryClient, () => import('./routes/app/shop/billing/billing')) },
                { path: 'support-access', lazy: load(queryClient, () => import('./routes/app/shop/billing/support-access')) },
                { path: 'lookup', lazy: load(queryClient, () => import('./routes/app/shop/lookup')) },
                { path: 'catalogue', lazy: load(queryClient, () => import('./routes/app/shop/catalogue/list')) },
                { path: 'catalogue/import', lazy: load(queryClient, () => import('./routes/app/shop/catalogue/import')) },
                {
                  path: 'catalogue/:partId',
                  // Defined here rather than in the page's module, so the part and its lineage are
                  // asked for while the page's code loads, not after (docs/decisions/022-first-load.md).
                  loader: async ({ params }) => {
                    if (params['shopId'] && params['partId']) {
                      await Promise.all([
                        queryClient.prefetchQuery(partQueryOptions(params['shopId'], params['partId'])),
                        queryClient.prefetchQuery(lineageQueryOptions(params['shopId'], params['partId'])),
                      ]);
                    }
                    return null;
                  },
                  lazy: load(queryClient, () => import('./routes/app/shop/catalogue/part')),
                },
                { path: 'vehicles', lazy: load(queryClient, () => import('./routes/app/shop/vehicles/list')) },
                { path: 'vehicles/:vehicleId', lazy: load(queryClient, () => import('./routes/app/shop/vehicles/vehicle')) },
                { path: 'jobs', lazy: load(queryClient, () => import('./routes/app/shop/jobs/list')) },
                { path: 'jobs/:jobId', lazy: load(queryClient, () => import('./routes/app/shop/jobs/job')) },
                { path: 'checklist-templates', lazy: load(queryClient, () => import('./routes/app/shop/jobs/templates')) },
                { path: 'stock', lazy: load(queryClient, () => import('./routes/app/shop/stock/list')) },
                { path: 'stock/movements', lazy: load(queryClient, () => import('./routes/app/shop/stock/movements')) },
                { path: 'stock/holds', lazy: load(queryClient, () => import('./routes/app/shop/stock/holds')) },
                { path: 'stock/bins', lazy: load(queryClient, () => import('./routes/app/shop/stock/bins')) },
                { path: 'stock/value', lazy: load(queryClient, () => import('./routes/app/shop/stock/value')) },
                { path: 'counts', lazy: load(queryClient, () => import('./routes/app/shop/counts/list')) },
                { path: 'counts/:countId', lazy: load(queryClient, () => import('./routes/app/shop/counts/count')) },
                { path: 'counts/:countId/differences', lazy: load(queryClient, () => import('./routes/app/shop/counts/differences')) },
                // Purchasing has no page of its own: its first screen is the reorder list.
                { path: 'purchasing', loader: ({ params }) => redirect(paths.shop.purchasingReorder.getHref(params['shopId'] ?? '')) },
                { path: 'purchasing/reorder', lazy: load(queryClient, () => import('./routes/app/shop/purchasing/reorder')) },
                { path: 'purchasing/orders', lazy: load(queryClient, () => import('./routes/app/shop/purchasing/orders')) },
                { path: 'purchasing/orders/:orderId', lazy: load(queryClient, () => import('./routes/app/shop/purchasing/order')) },
                { path: 'purchasing/suppliers', lazy: load(queryClient, () => import('./routes/app/shop/purchasing/suppliers')) },
                { path: 'purchasing/suppliers/:supplierId', lazy: load(queryClient, () => import('./routes/app/shop/purchasing/supplier')) },
                { path: 'purchasing/returns', lazy: load(queryClient, () => import('./routes/app/shop/purchasing/returns')) },
                // Sales (issue 12): the first screen is the invoices list.
                { path: 'sales', loader: ({ params }) => redirect(paths.shop.salesInvoices.getHref(params['shopId'] ?? '')) },
                { path: 'sales/invoices', lazy: load(queryClient, () => import('./routes/app/shop/sales/invoices')) },
                { path: 'sales/invoices/:invoiceId', lazy: load(queryClient, () => import('./routes/app/shop/sales/invoice')) },
                { path: 'sales/counter', lazy: load(queryClient, () => import('./routes/app/shop/sales/counter')) },
                { path: 'sales/pricing', lazy: load(queryClient, () => import('./routes/app/shop/sales/pricing')) },
                { path: 'sales/reports', lazy: load(queryClient, () => import('./routes/app/shop/sales-reports/reports')) },
                { path: 'consignment', lazy: load(queryClient, () => import('./routes/app/shop/consignment/list')) },
                { path: 'consignment/:vehicleId', lazy: load(queryClient, () => import('./routes/app/shop/consignment/vehicle')) },
              ],
            },
            { path: paths.platform.path, lazy: load(queryClient, () => import('./routes/app/platform')) },
            { path: paths.platformPlans.path, lazy: load(queryClient, () => import('./routes/app/platform-plans')) },
            { path: paths.noShop.path, lazy: load(queryClient, () => import('./routes/app/no-shop')) },
            { path: paths.apiDocs.path, lazy: load(queryClient, () => import('./routes/app/api-docs')) },
          ],
        },
        { path: '*', lazy: load(queryClient, () => import('./routes/not-found')) },
      ],
    },
  ];
  const router = createRouter(routes);
  // Every signed-in screen waits for /api/me first: start it now, beside the first screen's code,
  // rather than once the layout's chunk has loaded and its loader asks (the loaders find it in
  // the cache). The public pages (sign-in, invitations, estimate approval) do not need it.
  const publicPaths: string[] = Object.values(paths.auth).map((p) => p.path);
  if (!publicPaths.includes(router.state.location.pathname)) void queryClient.prefetchQuery(meQueryOptions());
  return router;
}
