// Every client route in one place. `path` is the router pattern; `getHref()` builds a link.

const withQuery = (path: string, query: Record<string, string | null | undefined>) => {
  const search = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v) search.set(k, v);
  const text = search.toString();
  return text ? `${path}?${text}` : path;
};

export const paths = {
  home: { path: '/', getHref: () => '/' },

  auth: {
    signIn: {
      path: '/sign-in',
      /** `redirectTo` is where to go after signing in (kept from the page the user asked for). */
      getHref: (redirectTo?: string | null) => withQuery('/sign-in', { redirectTo }),
    },
    acceptInvite: { path: '/accept-invite', getHref: (token: string) => withQuery('/accept-invite', { token }) },
    /** Without a token: the "forgot password" request form; with one: choose a new password. */
    resetPassword: { path: '/reset-password', getHref: (token?: string) => withQuery('/reset-password', { token }) },
  },

  app: {
    bench: { path: '/bench', getHref: () => '/bench' },
    parts: {
      path: '/parts',
      getHref: (filters?: { kind?: string; status?: string; q?: string }) => withQuery('/parts', { ...filters }),
    },
    part: { path: '/parts/:id', getHref: (id: number | string) => `/parts/${encodeURIComponent(String(id))}` },
    lots: { path: '/lots', getHref: () => '/lots' },
    lot: { path: '/lots/:id', getHref: (id: number | string) => `/lots/${encodeURIComponent(String(id))}` },
    compare: { path: '/compare', getHref: () => '/compare' },
    harness: { path: '/harness', getHref: () => '/harness' },
    harnessDesign: { path: '/harness/designs/:id', getHref: (id: number | string) => `/harness/designs/${encodeURIComponent(String(id))}` },
    jobs: { path: '/jobs', getHref: () => '/jobs' },
    job: { path: '/jobs/:id', getHref: (id: number | string) => `/jobs/${encodeURIComponent(String(id))}` },
    team: { path: '/team', getHref: () => '/team' },
    outbox: { path: '/outbox', getHref: () => '/outbox' },
  },
} as const;

/** Only same-site paths may be a redirect target (no `//host` or `https:` open redirects). */
export function safeRedirect(target: string | null | undefined, fallback: string): string {
  if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) return fallback;
  if (target.startsWith(paths.auth.signIn.path)) return fallback;
  return target;
}
