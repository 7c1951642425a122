import { describe, expect, test } from 'vitest';
import { clientLayerViolations, importViolations, serverFeatureViolations } from './support/check-imports';

test('imports flow one way: shared → server or src, never between server and src or between client features', () => {
  expect(importViolations()).toEqual([]);
});

// The rules themselves, on made-up paths, so a rule that stopped reporting would show here.
describe('the layer rules report what they forbid', () => {
  test('client: components, lib and data import neither features nor app; features do not import app or each other', () => {
    expect(
      clientLayerViolations('src/components/ui/badge.tsx', 'src/features/parts/api/get-part', '@/features/parts/api/get-part'),
    ).toHaveLength(1);
    expect(clientLayerViolations('src/lib/format.ts', 'src/app/router', '@/app/router')).toHaveLength(1);
    expect(clientLayerViolations('src/data/parts.ts', 'src/features/parts/api/sweeps', '@/features/parts/api/sweeps')).toHaveLength(1);
    expect(clientLayerViolations('src/data/parts.ts', 'src/app/router', '@/app/router')).toHaveLength(1);
    expect(clientLayerViolations('src/features/jobs/components/x.tsx', 'src/data/jobs', '@/data/jobs')).toEqual([]);
    expect(clientLayerViolations('src/features/jobs/components/x.tsx', 'src/app/provider', '@/app/provider')).toHaveLength(1);
    expect(
      clientLayerViolations('src/features/jobs/components/x.tsx', 'src/features/parts/api/get-part', '@/features/parts/api/get-part'),
    ).toHaveLength(1);
    expect(clientLayerViolations('src/app/routes/jobs.tsx', 'src/features/jobs/components/x', '@/features/jobs/components/x')).toEqual([]);
    expect(clientLayerViolations('src/features/jobs/components/x.tsx', 'src/components/ui/badge', '@/components/ui/badge')).toEqual([]);
    expect(clientLayerViolations('src/features/jobs/components/x.tsx', 'src/features/jobs/api/get-job', '../api/get-job')).toEqual([]);
  });

  test("server: a feature uses another feature's repository or service, never its router", () => {
    expect(serverFeatureViolations('server/features/jobs/service.ts', 'server/features/parts/router', '../parts/router')).toHaveLength(1);
    expect(serverFeatureViolations('server/features/jobs/service.ts', 'server/features/parts/repository', '../parts/repository')).toEqual(
      [],
    );
    expect(serverFeatureViolations('server/features/jobs/service.ts', 'server/features/jobs/router', './router')).toEqual([]);
    expect(serverFeatureViolations('server/app.ts', 'server/features/parts/router', './features/parts/router')).toEqual([]);
  });
});
