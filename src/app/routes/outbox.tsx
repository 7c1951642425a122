import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs, ShouldRevalidateFunction } from 'react-router-dom';
import { outboxQueryOptions } from '@/features/outbox/api/get-outbox';
import { OutboxScreen } from '@/features/outbox/components/outbox-screen';
import { requireCapability } from '../route-guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireCapability(queryClient, request, 'admin');
    await queryClient.ensureQueryData(outboxQueryOptions());
    return null;
  };

// Opening a message only changes ?message=.
export const shouldRevalidate: ShouldRevalidateFunction = ({ currentUrl, nextUrl, defaultShouldRevalidate }) =>
  currentUrl.pathname !== nextUrl.pathname && defaultShouldRevalidate;

export const Component = OutboxScreen;
