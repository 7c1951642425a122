// Which Host headers the app answers to.
/** PUBLIC_URL's host, the listed ones, and outside production the loopback names; lower case, without ports. */
export function allowedHostNames(publicUrl: string, listed: string[], production: boolean): string[] {
  const names = new Set<string>([new URL(publicUrl).hostname.toLowerCase()]);
  for (const h of listed) if (h.trim()) names.add(hostName(h.trim()));
  if (!production) for (const h of ['localhost', '127.0.0.1', '[::1]']) names.add(h);
  return [...names];
}

/** "Example.test:3000" → "example.test"; "[::1]:3000" → "[::1]". */
export function hostName(host: string): string {
  const h = host.toLowerCase();
  if (h.startsWith('[')) return h.slice(0, h.indexOf(']') + 1);
  const colon = h.lastIndexOf(':');
  return colon === -1 ? h : h.slice(0, colon);
}
