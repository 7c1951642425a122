import type { QueryClient } from '@tanstack/react-query';
import { data, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { harnessQueryOptions } from '@/features/harness/api/get-harness';
import { DesignPage } from '@/features/harness/components/design-page';

const designId = (raw: string | undefined) => {
  const id = Number(raw);
  return Number.isInteger(id) && id > 0 ? id : null;
};

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = designId(params.id);
    if (id === null) throw data('There is no such design.', { status: 404 });
    await queryClient.ensureQueryData(harnessQueryOptions(id));
    return null;
  };

export function Component() {
  const id = designId(useParams().id);
  return id === null ? null : <DesignPage key={id} id={id} />;
}
