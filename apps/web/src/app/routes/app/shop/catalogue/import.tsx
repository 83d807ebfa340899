import { EmptyState } from '@tappet/ui';
import { Link, useParams } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { paths } from '../../../../../config/paths';
import { ImportForm } from '../../../../../features/catalogue/components/import-form';
import { useCan } from '../../../../../lib/ability';
import { useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

/** Import a CSV file of parts, links or fitments: check it first, then import it whole. */
export default function CatalogueImportRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canImport = useCan('import', 'Part', { shopId });
  useDocumentTitle(membership ? `${membership.shopName} · Import` : 'Import');

  if (!membership) return null;
  const back = (
    <Link to={paths.shop.catalogue.getHref(shopId)} className="text-accent underline underline-offset-4">
      Back to the catalogue
    </Link>
  );

  return (
    <>
      <PageHeader
        eyebrow={membership.shopName}
        title="Import into the catalogue"
        description="Check a CSV file first: nothing is written until it has no errors and you import it. An import is all or nothing."
      />
      {canImport ? (
        <div className="flex flex-col gap-4">
          <ImportForm shopId={shopId} />
          <p>{back}</p>
        </div>
      ) : (
        <EmptyState title="Importing is for the owner and the parts buyer" action={back}>
          Ask them to import the file, or to change your role.
        </EmptyState>
      )}
    </>
  );
}
