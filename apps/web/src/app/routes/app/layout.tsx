import type { QueryClient } from '@tanstack/react-query';
import { IconBraces, IconHome, IconPlatform, IconShop, ThemeMenu, useToast } from '@tappet/ui';
import { useState } from 'react';
import { Navigate, Outlet, redirect, useLocation, useMatch, useNavigate, type LoaderFunctionArgs } from 'react-router-dom';
import { AppShell, type NavItem } from '../../../components/layouts/app-shell';
import { paths } from '../../../config/paths';
import { useSignOut } from '../../../features/auth/api/sign-out';
import { IconCatalogue } from '../../../features/catalogue/components/catalogue-icon';
import { IconApiKey } from '../../../features/api-keys/components/api-key-icon';
import { IconAuditLog } from '../../../features/audit/components/audit-icon';
import { IconLookup } from '../../../features/lookup/components/lookup-icon';
import { IconStock } from '../../../features/stock/components/stock-icon';
import { IconCounts } from '../../../features/counts/components/counts-icon';
import { IconPurchasing } from '../../../features/purchasing/components/purchasing-icon';
import { IconSales } from '../../../features/sales/components/sales-icon';
import { IconConsignment } from '../../../features/consignment/components/consignment-icon';
import { IconSalesReports } from '../../../features/sales-reports/components/sales-reports-icon';
import { IconVehicles } from '../../../features/vehicles/components/vehicle-icon';
import { IconJobs } from '../../../features/jobs/components/jobs-icon';
import { ShopSwitcher } from '../../../features/shops/components/shop-switcher';
import { IconStaff } from '../../../features/staff/components/staff-icon';
import { IconBilling, IconSupport } from '../../../features/billing/components/billing-icons';
import { abilityFor, canOn, ShopAbilityProvider } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { defaultShopId, meQueryOptions, useMe, type Me } from '../../../lib/auth';

/** Everything under this layout needs a session; without one, sign in and come back. */
export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQueryOptions());
    if (!me) {
      const url = new URL(request.url);
      throw redirect(paths.auth.signIn.getHref(url.pathname + url.search));
    }
    return null;
  };

/** The rail's entries: only screens that exist and that this person may use. */
function navFor(me: Me, shopId: string | null): NavItem[] {
  const items: NavItem[] = [];
  if (shopId) {
    // Lookup first: it is what people at the bench come for.
    if (canOn(abilityFor(me, shopId), 'read', 'Part', { shopId })) items.push({ to: paths.shop.lookup.getHref(shopId), label: 'Lookup', icon: <IconLookup /> });
    items.push({ to: paths.shop.home.getHref(shopId), label: 'Home', icon: <IconHome />, end: true });
    if (canOn(abilityFor(me, shopId), 'read', 'Part', { shopId })) {
      items.push({ to: paths.shop.catalogue.getHref(shopId), label: 'Catalogue', icon: <IconCatalogue /> });
    }
    if (canOn(abilityFor(me, shopId), 'read', 'Stock', { shopId })) items.push({ to: paths.shop.stock.getHref(shopId), label: 'Stock', icon: <IconStock /> });
    if (canOn(abilityFor(me, shopId), 'read', 'StockCount', { shopId })) items.push({ to: paths.shop.counts.getHref(shopId), label: 'Counts', icon: <IconCounts /> });
    if (canOn(abilityFor(me, shopId), 'read', 'PurchaseOrder', { shopId })) items.push({ to: paths.shop.purchasingReorder.getHref(shopId), label: 'Purchasing', icon: <IconPurchasing /> });
    if (canOn(abilityFor(me, shopId), 'read', 'Invoice', { shopId })) items.push({ to: paths.shop.salesInvoices.getHref(shopId), label: 'Sales', icon: <IconSales /> });
    if (canOn(abilityFor(me, shopId), 'read', 'SalesReport', { shopId })) items.push({ to: paths.shop.salesReports.getHref(shopId), label: 'Sales reports', icon: <IconSalesReports /> });
    if (canOn(abilityFor(me, shopId), 'read', 'Consignment', { shopId })) items.push({ to: paths.shop.consignment.getHref(shopId), label: 'Consignment', icon: <IconConsignment /> });
    if (canOn(abilityFor(me, shopId), 'read', 'Vehicle', { shopId })) items.push({ to: paths.shop.vehicles.getHref(shopId), label: 'Vehicles', icon: <IconVehicles /> });
    if (canOn(abilityFor(me, shopId), 'read', 'Job', { shopId })) {
      // A mechanic lands on their own jobs; everyone else on the board.
      const mechanic = me.memberships.find((m) => m.shopId === shopId)?.role === 'mechanic';
      items.push({ to: paths.shop.jobs.getHref(shopId, mechanic ? 'view=mine' : undefined), label: 'Jobs', icon: <IconJobs /> });
    }
    if (canOn(abilityFor(me, shopId), 'update', 'Shop', { shopId })) {
      items.push({ to: paths.shop.settings.getHref(shopId), label: 'Shop', icon: <IconShop /> });
    }
    if (canOn(abilityFor(me, shopId), 'read', 'Staff', { shopId })) items.push({ to: paths.shop.staff.getHref(shopId), label: 'Staff', icon: <IconStaff /> });
    if (canOn(abilityFor(me, shopId), 'read', 'AuditLog', { shopId })) items.push({ to: paths.shop.auditLog.getHref(shopId), label: 'Audit log', icon: <IconAuditLog /> });
    if (canOn(abilityFor(me, shopId), 'read', 'ApiKey', { shopId })) items.push({ to: paths.shop.apiKeys.getHref(shopId), label: 'API keys', icon: <IconApiKey /> });
    if (canOn(abilityFor(me, shopId), 'read', 'Billing', { shopId })) items.push({ to: paths.shop.billing.getHref(shopId), label: 'Billing', icon: <IconBilling /> });
    if (canOn(abilityFor(me, shopId), 'read', 'SupportAccess', { shopId })) {
      items.push({ to: paths.shop.supportAccess.getHref(shopId), label: 'Support access', icon: <IconSupport /> });
    }
    if (me.user.isPlatformAdmin) items.push({ to: paths.platform.getHref(), label: 'Platform', icon: <IconPlatform /> });
  } else if (me.user.isPlatformAdmin) {
    items.push({ to: paths.platform.getHref(), label: 'Home', icon: <IconHome />, end: true });
    items.push({ to: paths.platformPlans.getHref(), label: 'Plans', icon: <IconBilling /> });
  } else {
    items.push({ to: paths.noShop.getHref(), label: 'Home', icon: <IconHome /> });
  }
  items.push({ to: paths.apiDocs.getHref(), label: 'API documentation', icon: <IconBraces /> });
  return items;
}

export default function AppLayoutRoute() {
  const me = useMe();
  const location = useLocation();
  const navigate = useNavigate();
  const toast = useToast();
  const signOut = useSignOut();
  const [signingOut, setSigningOut] = useState(false);
  const match = useMatch({ path: paths.shop.home.path, end: false });

  if (!me) {
    // Signed out here, or the session ended (a 401 anywhere clears "me").
    const target = signingOut ? paths.auth.signIn.getHref() : paths.auth.signIn.getHref(location.pathname + location.search);
    return <Navigate to={target} replace />;
  }

  const urlShopId = match?.params.shopId ?? null;
  // On a shop URL the URL decides; elsewhere (API docs, platform) the session's active shop does.
  const shopId = urlShopId ? (me.memberships.some((m) => m.shopId === urlShopId) ? urlShopId : null) : defaultShopId(me);
  const nav = navFor(me, shopId);
  // The logo leads home, not to whatever the rail lists first.
  const home = nav.find((item) => item.label === 'Home')?.to ?? nav[0]?.to ?? '/';

  return (
    <ShopAbilityProvider me={me} shopId={shopId}>
      <AppShell
        homeHref={home}
        nav={nav}
        context={<ShopSwitcher me={me} currentShopId={shopId} />}
        userName={me.user.name}
        signingOut={signOut.isPending}
        onSignOut={() => {
          setSigningOut(true);
          signOut.mutate(undefined, {
            onSuccess: () => navigate(paths.auth.signIn.getHref(), { replace: true }),
            onError: (error) => {
              toast.show(errorMessage(error), 'fail');
              navigate(paths.auth.signIn.getHref(), { replace: true });
            },
          });
        }}
        railFooter={<ThemeMenu />}
      >
        <Outlet />
      </AppShell>
    </ShopAbilityProvider>
  );
}
