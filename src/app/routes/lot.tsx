import type { QueryClient } from '@tanstack/react-query';
import { data, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { lotQueryOptions } from '@/features/lots/api/get-lot';
import { DEFAULT_MATCH } from '@/features/lots/api/types';
import { LotScreen } from '@/features/lots/components/lot-screen';

const lotId = (raw: string | undefined) => {
  const id = Number(raw);
  return Number.isInteger(id) && id > 0 ? id : null;
};

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = lotId(params.id);
    if (id === null) throw data('There is no such lot.', { status: 404 });
    // The screen opens with the default matching; the items (up to 100,000) load on the screen.
    await queryClient.ensureQueryData(lotQueryOptions(id, DEFAULT_MATCH));
    return null;
  };

export function Component() {
  const id = lotId(useParams().id);
  return id === null ? null : <LotScreen key={id} id={id} />;
}
