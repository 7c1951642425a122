// One owner per query key (DEVELOPERS.md, "Query keys"): every key is built by the factory in
// src/data/query-keys.ts, each factory key is given to one query-option factory only, and mutations
// name what they make stale through the factory too. Read from the source text, so a key written
// out inline anywhere in src/ fails here.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { queryKeys } from '@/data/query-keys';

const root = fileURLToPath(new URL('../..', import.meta.url));
const FACTORY = 'src/data/query-keys.ts';

function sources(): { file: string; text: string }[] {
  return fs
    .readdirSync(path.join(root, 'src'), { recursive: true, encoding: 'utf8' })
    .filter((f) => /\.(ts|tsx)$/.test(f))
    .map((f) => path.join('src', f).split(path.sep).join('/'))
    .map((file) => ({ file, text: fs.readFileSync(path.join(root, file), 'utf8') }));
}

/** `a, [b, c], f(d, e)` → ['a', '[b, c]', 'f(d, e)']: the items of a list, split at its own commas. */
function topLevelItems(list: string): string[] {
  const items: string[] = [];
  let depth = 0;
  let start = 0;
  for (let i = 0; i < list.length; i++) {
    const c = list[i];
    if (c === '[' || c === '(' || c === '{') depth++;
    else if (c === ']' || c === ')' || c === '}') depth--;
    else if (c === ',' && depth === 0) {
      items.push(list.slice(start, i));
      start = i + 1;
    }
  }
  items.push(list.slice(start));
  return items.map((p) => p.trim()).filter(Boolean);
}

/** Keys written out instead of taken from the factory, and which files give each factory key to a queryOptions call. */
function keyUses(files: { file: string; text: string }[]) {
  const inline: string[] = [];
  const owners = new Map<string, string[]>();
  for (const { file, text } of files) {
    if (file === FACTORY) continue;
    for (const m of text.matchAll(/queryKey:\s*([^,\n}]+)/g)) {
      const expr = m[1]!.trim();
      // src/lib owns who-is-signed-in (ME_QUERY_KEY, the factory's auth.me) below every feature.
      const meInLib = expr === 'ME_QUERY_KEY' && file.startsWith('src/lib/');
      if (!/^queryKeys\.[a-zA-Z]+\.[a-zA-Z]+\(/.test(expr) && !meInLib) inline.push(`${file}: queryKey: ${expr}`);
    }
    // The owners: the query-option factories (every queryOptions call names its key first).
    for (const m of text.matchAll(/queryOptions\(\{\s*queryKey:\s*(?:queryKeys\.([a-zA-Z]+\.[a-zA-Z]+)\(|(ME_QUERY_KEY))/g)) {
      const key = m[1] ?? 'auth.me';
      owners.set(key, [...(owners.get(key) ?? []), file]);
    }
    for (const m of text.matchAll(/invalidates:\s*\[([\s\S]*?)\]\s*\}/g)) {
      for (const part of topLevelItems(m[1]!))
        if (!/^queryKeys\.[a-zA-Z]+\.[a-zA-Z]+\([^)]*\)$/.test(part)) inline.push(`${file}: invalidates ${part}`);
    }
  }
  return { inline, owners };
}

describe('query keys', () => {
  const { inline, owners } = keyUses(sources());

  it('are never written out inline: every queryKey and every invalidated prefix comes from the factory', () => {
    expect(inline).toEqual([]);
  });

  it('each belong to one query-option factory (no key declared twice, so no key with two answer types)', () => {
    const shared = [...owners].filter(([, files]) => files.length > 1).map(([key, files]) => `${key}: ${files.join(', ')}`);
    expect(shared).toEqual([]);
  });

  it('nest by domain, so a prefix makes every query under it stale', () => {
    const underParts = [queryKeys.parts.detail(7), queryKeys.parts.fits(7), queryKeys.parts.sweeps(7), queryKeys.parts.list({})];
    for (const key of underParts) expect(key.slice(0, 1)).toEqual(queryKeys.parts.all());
    expect(queryKeys.parts.fits(7).slice(0, 3)).toEqual(queryKeys.parts.detail(7));
    expect(queryKeys.jobs.report(3).slice(0, 3)).toEqual(queryKeys.jobs.detail(3));
    expect(queryKeys.lots.items(2, { matchPct: 1, setSize: 2 }).slice(0, 3)).toEqual(['lots', 'detail', 2]);
  });

  it('catch an inline key and a key given to two factories (the check can fail)', () => {
    const planted = keyUses([
      { file: 'src/features/a/api/x.ts', text: "queryOptions({ queryKey: ['parts', 'detail', id], queryFn })" },
      { file: 'src/features/b/api/y.ts', text: 'queryOptions({ queryKey: queryKeys.jobs.list(), queryFn })' },
      { file: 'src/features/c/api/z.ts', text: 'queryOptions({ queryKey: queryKeys.jobs.list(), queryFn })' },
      { file: 'src/features/d/api/w.ts', text: "useMutation({ mutationFn, meta: { invalidates: [queryKeys.lots.all(), ['outbox']] } })" },
    ]);
    expect(planted.inline).toEqual(["src/features/a/api/x.ts: queryKey: ['parts'", "src/features/d/api/w.ts: invalidates ['outbox']"]);
    expect(planted.owners.get('jobs.list')).toHaveLength(2);
  });
});
