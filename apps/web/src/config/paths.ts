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
  },
  shop: {
    home: { path: '/shops/:shopId', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}` },
    settings: { path: '/shops/:shopId/shop', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/shop` },
    staff: { path: '/shops/:shopId/staff', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/staff` },
    auditLog: { path: '/shops/:shopId/audit-log', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/audit-log` },
    apiKeys: { path: '/shops/:shopId/api-keys', getHref: (shopId: string) => `/shops/${encodeURIComponent(shopId)}/api-keys` },
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
  },
  platform: { path: '/platform', getHref: () => '/platform' },
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
