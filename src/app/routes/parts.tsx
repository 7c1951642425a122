import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs, ShouldRevalidateFunction } from 'react-router-dom';
import { partsQueryOptions } from '@/data/parts';
import { PARTS_LIST_LIMIT, filtersFromSearch } from '@/features/parts/api/get-parts';
import { PartsScreen } from '@/features/parts/components/parts-screen';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const filters = filtersFromSearch(new URL(request.url).searchParams);
    await queryClient.ensureQueryData(partsQueryOptions({ ...filters, limit: PARTS_LIST_LIMIT }));
    return null;
  };

// Filter changes only touch the query string; the screen's query follows them without holding
// the navigation on the loader.
export const shouldRevalidate: ShouldRevalidateFunction = ({ currentUrl, nextUrl, defaultShouldRevalidate }) =>
  currentUrl.pathname !== nextUrl.pathname && defaultShouldRevalidate;

export const Component = PartsScreen;
