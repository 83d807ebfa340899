import type { QueryClient } from '@tanstack/react-query';
import { useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { useApiKeys } from '../../../../../features/api-keys/api/get-api-keys';
import { auditEventsQueryOptions, type AuditFilters } from '../../../../../features/audit/api/get-audit-events';
import { AuditLog } from '../../../../../features/audit/components/audit-log';
import { useStaff } from '../../../../../features/staff/api/get-staff';
import { abilityFor, canOn, useCan } from '../../../../../lib/ability';
import { meQueryOptions, useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';
import { OwnerOnly } from './owner-only';

const dateRe = /^\d{4}-\d{2}-\d{2}$/;

/** The filters live in the URL, so a filtered view can be bookmarked and shared. */
function filtersFrom(search: URLSearchParams): { filters: AuditFilters; page: number } {
  const date = (key: string) => {
    const value = search.get(key) ?? '';
    return dateRe.test(value) ? value : '';
  };
  const page = Number(search.get('page') ?? '1');
  return {
    filters: { actor: search.get('actor') ?? '', entity: search.get('entity') ?? '', from: date('from'), to: date('to') },
    page: Number.isInteger(page) && page >= 1 ? page : 1,
  };
}

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params, request }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQueryOptions());
    if (me && params.shopId && canOn(abilityFor(me, params.shopId), 'read', 'AuditLog', { shopId: params.shopId })) {
      const { filters, page } = filtersFrom(new URL(request.url).searchParams);
      void queryClient.prefetchQuery(auditEventsQueryOptions(params.shopId, filters, page));
    }
    return null;
  };

/** Audit log (owners): every write in the shop, filterable, with a CSV of the same filters. */
export default function AuditLogRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const [search, setSearch] = useSearchParams();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canRead = useCan('read', 'AuditLog', { shopId });
  // People and keys to filter by; the log itself works without them.
  const staff = useStaff(shopId, { enabled: canRead });
  const keys = useApiKeys(shopId, { enabled: canRead });
  useDocumentTitle(membership ? `${membership.shopName} · Audit log` : 'Audit log');

  if (!membership) return null;
  if (!canRead) return <OwnerOnly shopId={shopId} shopName={membership.shopName} title="Audit log" />;

  const { filters, page } = filtersFrom(search);
  const actors = [
    ...(staff.data?.members ?? []).map((m) => ({ value: m.userId, label: `${m.name}${m.isActive ? '' : ' (deactivated)'}` })),
    ...(keys.data ?? []).map((k) => ({ value: k.id, label: `API key “${k.label}”` })),
  ];

  return (
    <>
      <PageHeader eyebrow={membership.shopName} title="Audit log" description="Every change in the shop: who made it, what changed, when and from where. Nothing here can be edited or deleted." />
      <AuditLog
        shopId={shopId}
        filters={filters}
        page={page}
        actors={actors}
        onChange={(next, nextPage) => {
          const params = new URLSearchParams();
          for (const [key, value] of Object.entries(next)) if (value) params.set(key, value);
          if (nextPage > 1) params.set('page', String(nextPage));
          setSearch(params, { replace: true });
        }}
      />
    </>
  );
}
