import type { QueryClient } from '@tanstack/react-query';
import type { ComponentType } from 'react';
import type { LoaderFunction, ShouldRevalidateFunction } from 'react-router-dom';

/**
 * What a file in src/app/routes/ exports: the screen, and optionally a loader factory that gets
 * the app's QueryClient (so loaders prefetch with the same queryOptions the screen uses).
 */
export interface RouteModule {
  Component: ComponentType;
  makeLoader?: (queryClient: QueryClient) => LoaderFunction;
  shouldRevalidate?: ShouldRevalidateFunction;
}
