import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs, ShouldRevalidateFunction } from 'react-router-dom';
import { compareCandidatesQueryOptions } from '@/features/compare/api/get-candidates';
import { comparisonQueryOptions, comparisonsQueryOptions } from '@/features/compare/api/get-comparisons';
import { CompareScreen, studyIdFromSearch } from '@/features/compare/components/compare-screen';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const studyId = studyIdFromSearch(new URL(request.url).searchParams);
    await Promise.all([
      queryClient.ensureQueryData(compareCandidatesQueryOptions()),
      queryClient.ensureQueryData(comparisonsQueryOptions()),
      // A study that cannot be opened (deleted, bad link) is reported on the screen, not as a route error.
      studyId ? queryClient.ensureQueryData(comparisonQueryOptions(studyId)).catch(() => null) : null,
    ]);
    return null;
  };

// Opening another study only changes ?study=; the screen's queries follow it.
export const shouldRevalidate: ShouldRevalidateFunction = ({ currentUrl, nextUrl, defaultShouldRevalidate }) =>
  currentUrl.pathname !== nextUrl.pathname && defaultShouldRevalidate;

export const Component = CompareScreen;
