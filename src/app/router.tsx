// Every screen of docs/screens.md. To add a screen: write src/app/routes/<screen>.tsx exporting
// `Component` (and `makeLoader` to prefetch), add its path to src/config/paths.ts, list it below,
// and give it a nav entry in src/config/nav.ts if it belongs in the menu.
import type { QueryClient } from '@tanstack/react-query';
import { useQueryClient } from '@tanstack/react-query';
import { useMemo } from 'react';
import {
  RouterProvider,
  createBrowserRouter,
  redirect,
  type LoaderFunction,
  type LoaderFunctionArgs,
  type RouteObject,
} from 'react-router-dom';
import { HOME_BY_ROLE } from '@shared/auth/capabilities';
import { paths } from '@/config/paths';
import { AppLayout } from './layout/app-layout';
import { RouteError } from './layout/route-error';
import { requireUser } from './route-guards';
import type { RouteModule } from './routes/route-module';

/**
 * Turns a lazily imported route module into what React Router's `lazy` expects. Loaders of
 * signed-in screens first wait for the session check: React Router runs the loaders of all matched
 * routes at once, and an anonymous visitor should be sent to sign-in without any data request.
 */
const load = (queryClient: QueryClient, importer: () => Promise<RouteModule>, signedIn: boolean) => async () => {
  const { Component, makeLoader, shouldRevalidate } = await importer();
  const loader = makeLoader?.(queryClient);
  const guarded: LoaderFunction | undefined =
    loader && signedIn
      ? async (args, handlerCtx) => {
          await requireUser(queryClient, args.request);
          return loader(args, handlerCtx);
        }
      : loader;
  return { Component, ...(guarded ? { loader: guarded } : {}), ...(shouldRevalidate ? { shouldRevalidate } : {}) };
};

function Booting() {
  return <p className="p-6 text-sm text-ink-soft">Opening Lugbook…</p>;
}

export function createAppRouter(queryClient: QueryClient) {
  const open = (path: string, importer: () => Promise<RouteModule>): RouteObject => ({ path, lazy: load(queryClient, importer, false) });
  const screen = (path: string, importer: () => Promise<RouteModule>): RouteObject => ({ path, lazy: load(queryClient, importer, true) });

  const routes: RouteObject[] = [
    {
      path: '/',
      HydrateFallback: Booting,
      errorElement: <RouteError />,
      children: [
        open(paths.auth.signIn.path, () => import('./routes/sign-in')),
        open(paths.auth.acceptInvite.path, () => import('./routes/accept-invite')),
        open(paths.auth.resetPassword.path, () => import('./routes/reset-password')),
        {
          // Everything below needs a signed-in user.
          id: 'app',
          element: <AppLayout />,
          loader: ({ request }: LoaderFunctionArgs) => requireUser(queryClient, request),
          children: [
            {
              errorElement: <RouteError />,
              children: [
                {
                  index: true,
                  loader: async ({ request }: LoaderFunctionArgs) => {
                    const user = await requireUser(queryClient, request);
                    return redirect(HOME_BY_ROLE[user.role]);
                  },
                },
                screen(paths.app.bench.path, () => import('./routes/bench')),
                screen(paths.app.parts.path, () => import('./routes/parts')),
                screen(paths.app.part.path, () => import('./routes/part')),
                screen(paths.app.lots.path, () => import('./routes/lots')),
                screen(paths.app.lot.path, () => import('./routes/lot')),
                screen(paths.app.compare.path, () => import('./routes/compare')),
                screen(paths.app.harness.path, () => import('./routes/harness')),
                screen(paths.app.harnessDesign.path, () => import('./routes/harness-design')),
                screen(paths.app.jobs.path, () => import('./routes/jobs')),
                screen(paths.app.job.path, () => import('./routes/job')),
                screen(paths.app.team.path, () => import('./routes/team')),
                screen(paths.app.outbox.path, () => import('./routes/outbox')),
                screen('*', () => import('./routes/not-found')),
              ],
            },
          ],
        },
      ],
    },
  ];
  return createBrowserRouter(routes);
}

export function AppRouter() {
  const queryClient = useQueryClient();
  const router = useMemo(() => createAppRouter(queryClient), [queryClient]);
  return <RouterProvider router={router} />;
}
