import type { QueryClient } from '@tanstack/react-query';
import { ErrorState, LoadingState } from '@tappet/ui';
import { PageHeader } from '../../../components/layouts/page-header';
import { openApiQueryOptions, useOpenApi } from '../../../features/api-docs/api/get-openapi';
import { ApiReference } from '../../../features/api-docs/components/api-reference';
import { errorMessage } from '../../../lib/api-client';
import { useDocumentTitle } from '../../../lib/use-document-title';

export const clientLoader = (queryClient: QueryClient) => async () => {
  await queryClient.prefetchQuery(openApiQueryOptions());
  return null;
};

/** The API's OpenAPI document, readable in the app (no external viewer). */
export default function ApiDocsRoute() {
  useDocumentTitle('API documentation');
  const doc = useOpenApi();
  return (
    <>
      <PageHeader
        title="API documentation"
        description="Every endpoint of Tappet’s HTTP API, generated from the same contracts the app uses."
      />
      {doc.isPending ? (
        <LoadingState label="Loading the API description…" />
      ) : doc.isError ? (
        <ErrorState message={errorMessage(doc.error)} onRetry={() => void doc.refetch()} />
      ) : (
        <ApiReference doc={doc.data} />
      )}
    </>
  );
}
