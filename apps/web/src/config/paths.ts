/**
 * Every route of the app, with the function that builds its URL. Links use `getHref`; the router
 * uses `path`. Shop screens live under /shops/:shopId so a URL always names its shop.
 */
export const paths = {
  root: { path: '/', getHref: () => '/' },
  auth: {
    signIn: {
      path: '/sign-in',
      getHref: (redirectTo?: string | null) =>
        redirectTo && redirectTo !== '/' ? `/sign-in?redirectTo=${encodeURIComponent(redirectTo)}` : '/sign-in',
    },
    forgotPassword: { path: '/forgot-password', getHref: () => '/forgot-password' },
    resetPassword: { path: '/reset-password', getHref: (token: string) => `/reset-password?token=${encodeURIComponent(token)}` },
    acceptInvitation: { path: '/accept-invitation', getHref: (token: string) => `/accept-invitation?token=${encodeURIComponent(token)}` },
    /** The customer's answer to an e-mailed estimate; the token rides in the fragment. */
    estimateApproval: { path: '/estimate-approval', getHref: (token: string) => `/estimate-approval#${token}` },
  },
  shop: {
    home: { path: '/shops/:shopId', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}` },
    settings: { path: '/shops/:shopId/shop', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/shop` },
    staff: { path: '/shops/:shopId/staff', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/staff` },
    auditLog: { path: '/shops/:shopId/audit-log', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/audit-log` },
    apiKeys: { path: '/shops/:shopId/api-keys', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/api-keys` },
    billing: { path: '/shops/:shopId/billing', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/billing` },
    supportAccess: { path: '/shops/:shopId/support-access', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/support-access` },
    lookup: { path: '/shops/:shopId/lookup', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/lookup` },
    catalogue: {
      path: '/shops/:shopId/catalogue',
      /** `search` is the list's filter state as a query string (without "?"), so filtered views can be linked. */
      getHref: (shopId: string, search?: string) => `/shops/${encodeURIComponent(shopId)}/catalogue${search ? `?${search}` : ''}`,
    },
    catalogueImport: { path: '/shops/:shopId/catalogue/import', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/catalogue/import` },
    part: {
      path: '/shops/:shopId/catalogue/:partId',
      getHref: (shopId: string, partId: string) => `/shops/${encodeURIComponent(shopId)}/catalogue/${encodeURIComponent(partId)}`,
    },
    vehicles: {
      path: '/shops/:shopId/vehicles',
      /** `search` is the list's filter state as a query string (without "?"). */
      getHref: (shopId: string, search?: string) => `/shops/${encodeURIComponent(shopId)}/vehicles${search ? `?${search}` : ''}`,
    },
    vehicle: {
      path: '/shops/:shopId/vehicles/:vehicleId',
      getHref: (shopId: string, vehicleId: string) => `/shops/${encodeURIComponent(shopId)}/vehicles/${encodeURIComponent(vehicleId)}`,
    },
    stock: {
      path: '/shops/:shopId/stock',
      /** `search` is the list's filter state as a query string (without "?"). */
      getHref: (shopId: string, search?: string) => `/shops/${encodeURIComponent(shopId)}/stock${search ? `?${search}` : ''}`,
    },
    stockMovements: {
      path: '/shops/:shopId/stock/movements',
      getHref: (shopId: string, search?: string) => `/shops/${encodeURIComponent(shopId)}/stock/movements${search ? `?${search}` : ''}`,
    },
    stockHolds: { path: '/shops/:shopId/stock/holds', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/stock/holds` },
    stockBins: { path: '/shops/:shopId/stock/bins', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/stock/bins` },
    stockValue: { path: '/shops/:shopId/stock/value', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/stock/value` },
    counts: { path: '/shops/:shopId/counts', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/counts` },
    count: { path: '/shops/:shopId/counts/:countId', getHref: (shopId: string, countId: string) => `/shops/${encodeURIComponent(shopId)}/counts/${encodeURIComponent(countId)}` },
    countReport: {
      path: '/shops/:shopId/counts/:countId/differences',
      getHref: (shopId: string, countId: string) => `/shops/${encodeURIComponent(shopId)}/counts/${encodeURIComponent(countId)}/differences`,
    },
    jobs: {
      path: '/shops/:shopId/jobs',
      /** `search`: `view=mine` for the caller's own jobs, `closed=true` to include done and cancelled. */
      getHref: (shopId: string, search?: string) => `/shops/${encodeURIComponent(shopId)}/jobs${search ? `?${search}` : ''}`,
    },
    job: { path: '/shops/:shopId/jobs/:jobId', getHref: (shopId: string, jobId: string) => `/shops/${encodeURIComponent(shopId)}/jobs/${encodeURIComponent(jobId)}` },
    checklistTemplates: { path: '/shops/:shopId/checklist-templates', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/checklist-templates` },
    purchasingReorder: { path: '/shops/:shopId/purchasing/reorder', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/purchasing/reorder` },
    purchasingOrders: { path: '/shops/:shopId/purchasing/orders', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/purchasing/orders` },
    purchasingOrder: {
      path: '/shops/:shopId/purchasing/orders/:orderId',
      getHref: (shopId: string, orderId: string) => `/shops/${encodeURIComponent(shopId)}/purchasing/orders/${encodeURIComponent(orderId)}`,
    },
    purchasingSuppliers: { path: '/shops/:shopId/purchasing/suppliers', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/purchasing/suppliers` },
    purchasingSupplier: {
      path: '/shops/:shopId/purchasing/suppliers/:supplierId',
      getHref: (shopId: string, supplierId: string) => `/shops/${encodeURIComponent(shopId)}/purchasing/suppliers/${encodeURIComponent(supplierId)}`,
    },
    purchasingReturns: { path: '/shops/:shopId/purchasing/returns', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/purchasing/returns` },
    // Sales (issue 12).
    salesInvoices: { path: '/shops/:shopId/sales/invoices', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/sales/invoices` },
    salesInvoice: {
      path: '/shops/:shopId/sales/invoices/:invoiceId',
      getHref: (shopId: string, invoiceId: string) => `/shops/${encodeURIComponent(shopId)}/sales/invoices/${encodeURIComponent(invoiceId)}`,
    },
    salesCounter: { path: '/shops/:shopId/sales/counter', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/sales/counter` },
    consignment: { path: '/shops/:shopId/consignment', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/consignment` },
    consignmentVehicle: { path: '/shops/:shopId/consignment/:vehicleId', getHref: (shopId: string, vehicleId: string) => `/shops/${encodeURIComponent(shopId)}/consignment/${encodeURIComponent(vehicleId)}` },
    salesReports: { path: '/shops/:shopId/sales/reports', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/sales/reports` },
    salesPricing: { path: '/shops/:shopId/sales/pricing', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/sales/pricing` },
  },
  platform: { path: '/platform', getHref: () => '/platform' },
  platformPlans: { path: '/platform/plans', getHref: () => '/platform/plans' },
  noShop: { path: '/welcome', getHref: () => '/welcome' },
  apiDocs: { path: '/api-docs', getHref: () => '/api-docs' },
} as const;

/**
 * Only a same-origin path may be a redirect target after sign-in (no `//host` or `scheme:`),
 * so a crafted link cannot send someone off-site.
 */
export function safeRedirect(target: string | null | undefined, fallback = '/'): string {
  if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) return fallback;
  if (target.startsWith(paths.auth.signIn.path)) return fallback;
  return target;
}
