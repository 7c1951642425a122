// The import boundaries DEVELOPERS.md states ("Layout"): shared/ imports neither server/ nor src/
// (nor Node, DOM or server packages); server/ and src/ never import each other; client features do
// not import each other; src/components, src/lib and src/data import neither features nor app; features do
// not import app; a server feature never imports another feature's router. Run by `npm run lint`
// and by tests/architecture.test.ts.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../..', import.meta.url));

function filesUnder(dir: string): string[] {
  const abs = path.join(root, dir);
  if (!fs.existsSync(abs)) return [];
  return fs
    .readdirSync(abs, { recursive: true, encoding: 'utf8' })
    .filter((f) => /\.(ts|tsx)$/.test(f))
    .map((f) => path.join(dir, f));
}

const IMPORT_RE = /(?:import|export)\s[^'"]*?from\s+['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g;

/** Resolves an import specifier to a repository-relative path, or null for packages. */
function resolveSpecifier(file: string, spec: string): string | null {
  if (spec.startsWith('@shared/')) return path.join('shared', spec.slice(8));
  if (spec.startsWith('@server/')) return path.join('server', spec.slice(8));
  if (spec.startsWith('@/')) return path.join('src', spec.slice(2));
  if (spec.startsWith('.')) return path.normalize(path.join(path.dirname(file), spec));
  return null;
}

const NODE_OR_DOM_IN_SHARED = /^(node:|fs$|path$|crypto$|better-sqlite3|express|drizzle-orm|react)/;

/** Inside src/: components, lib and data below features, features below app, features apart. */
export function clientLayerViolations(file: string, target: string, spec: string): string[] {
  const problems: string[] = [];
  const norm = (p: string) => p.split(path.sep).join('/');
  const [from, to] = [norm(file), norm(target)];
  const feature = from.match(/^src\/features\/([^/]+)\//)?.[1];
  const targetFeature = to.match(/^src\/features\/([^/]+)(\/|$)/)?.[1];
  const targetIsApp = /^src\/app(\/|$)/.test(to);
  if (feature && targetFeature && feature !== targetFeature) problems.push(`${file}: feature ${feature} imports feature ${targetFeature}`);
  if (/^src\/(components|lib|data)\//.test(from) && (targetFeature || targetIsApp))
    problems.push(`${file}: shared client code imports ${targetIsApp ? 'app' : `feature ${targetFeature}`} (${spec})`);
  if (feature && targetIsApp) problems.push(`${file}: feature ${feature} imports app (${spec})`);
  return problems;
}

/** Inside server/: a feature may use another feature's repository or service, never its router. */
export function serverFeatureViolations(file: string, target: string, spec: string): string[] {
  const norm = (p: string) => p.split(path.sep).join('/');
  const feature = norm(file).match(/^server\/features\/([^/]+)\//)?.[1];
  const routerOf = norm(target).match(/^server\/features\/([^/]+)\/router(\.ts)?$/)?.[1];
  return feature && routerOf && routerOf !== feature
    ? [`${file}: server feature ${feature} imports the router of ${routerOf} (${spec})`]
    : [];
}

export function importViolations(): string[] {
  const problems: string[] = [];
  for (const top of ['shared', 'server', 'src']) {
    for (const file of filesUnder(top)) {
      const text = fs.readFileSync(path.join(root, file), 'utf8');
      for (const m of text.matchAll(IMPORT_RE)) {
        const spec = (m[1] ?? m[2])!;
        const target = resolveSpecifier(file, spec);
        if (top === 'shared' && target === null && NODE_OR_DOM_IN_SHARED.test(spec)) problems.push(`${file}: shared code imports ${spec}`);
        if (!target) continue;
        const targetTop = target.split(path.sep)[0];
        if (top === 'shared' && targetTop !== 'shared') problems.push(`${file}: shared/ imports ${spec}`);
        if (top === 'server' && targetTop === 'src') problems.push(`${file}: server/ imports the client (${spec})`);
        if (top === 'src' && targetTop === 'server') problems.push(`${file}: the client imports server/ (${spec})`);
        problems.push(...clientLayerViolations(file, target, spec), ...serverFeatureViolations(file, target, spec));
      }
    }
  }
  return problems;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const problems = importViolations();
  for (const p of problems) console.log(p);
  console.log(problems.length === 0 ? 'import boundaries: ok' : `import boundaries: ${problems.length} problems`);
  process.exit(problems.length === 0 ? 0 : 1);
}
