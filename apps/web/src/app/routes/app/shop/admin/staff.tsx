import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { useSettings } from '../../../../../features/settings/api/get-settings';
import { staffQueryOptions } from '../../../../../features/staff/api/get-staff';
import { StaffScreen } from '../../../../../features/staff/components/staff-screen';
import { abilityFor, canOn, useCan } from '../../../../../lib/ability';
import { meQueryOptions, useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';
import { OwnerOnly } from './owner-only';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQueryOptions());
    // Prefetch only what the person may read; the page explains the rest.
    if (me && params.shopId && canOn(abilityFor(me, params.shopId), 'read', 'Staff', { shopId: params.shopId })) {
      void queryClient.prefetchQuery(staffQueryOptions(params.shopId));
    }
    return null;
  };

/** Staff (owners): who works in the shop, their roles and limits, and invitations. */
export default function StaffRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canManage = useCan('read', 'Staff', { shopId });
  // The currency of spending limits; until it arrives (or if it fails) pounds are a fair guess.
  const settings = useSettings(shopId, { enabled: canManage });
  useDocumentTitle(membership ? `${membership.shopName} · Staff` : 'Staff');

  if (!membership || !me) return null;
  if (!canManage) return <OwnerOnly shopId={shopId} shopName={membership.shopName} title="Staff" />;

  return (
    <>
      <PageHeader
        eyebrow={membership.shopName}
        title="Staff"
        description="Invite people by e-mail, give each the role they need, and deactivate those who leave."
      />
      <StaffScreen shopId={shopId} currency={settings.data?.currency ?? 'GBP'} myUserId={me.user.id} />
    </>
  );
}
