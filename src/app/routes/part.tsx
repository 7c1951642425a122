import type { QueryClient } from '@tanstack/react-query';
import { data, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { partQueryOptions } from '@/data/parts';
import { partReadingsQueryOptions } from '@/features/parts/api/get-readings';
import { sweepsQueryOptions } from '@/features/parts/api/sweeps';
import { PartScreen } from '@/features/parts/components/part-screen';

const partId = (raw: string | undefined) => {
  const id = Number(raw);
  return Number.isInteger(id) && id > 0 ? id : null;
};

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = partId(params.id);
    if (id === null) throw data('There is no such part.', { status: 404 });
    // The part decides the page (a 404 ends here); readings and sweeps are fetched alongside.
    void queryClient.prefetchQuery(partReadingsQueryOptions(id));
    void queryClient.prefetchQuery(sweepsQueryOptions(id));
    await queryClient.ensureQueryData(partQueryOptions(id));
    return null;
  };

export function Component() {
  const id = partId(useParams().id);
  return id === null ? null : <PartScreen key={id} id={id} />;
}
