// Every query key of the client, in one place. Keys are arrays that nest by data domain, so a
// mutation names a prefix (`queryKeys.parts.all()`) in `meta.invalidates` and every query under it
// goes stale (src/lib/react-query.ts). A key belongs to one query-option factory: the factory in
// the feature that alone uses the data, or in src/data/ when several features do. No query key is
// written out anywhere else (tests/src/query-keys.test.ts checks it).
import type { GroupBy } from '@shared/analysis/compare';
import type { CompareSelection } from '@shared/schemas/compare';
import type { PartKind, PartStatus } from '@shared/schemas/common';
import { ME_QUERY_KEY } from '@/lib/react-query';

/** The list filters of GET /api/parts. */
export type PartFilters = { kind?: PartKind; status?: PartStatus; q?: string; lotId?: number; limit?: number };
/** A scanned part address or a typed label (the Bench look-up). */
export type PartScan = { id: number } | { label: string };
/** The matched-set chooser of a lot: parts agreeing within matchPct %, in sets of setSize. */
export type LotMatch = { matchPct: number; setSize: number };
/** The body of POST /api/compare/tapers (a read, sent as a POST because a selection can be long). */
export type TapersRequest = { selection: CompareSelection; groupBy: GroupBy };

export const queryKeys = {
  auth: {
    /** Who is signed in; kept when another account signs in (src/lib/react-query.ts owns it). */
    me: () => ME_QUERY_KEY,
    invitation: (token: string) => ['auth', 'invitation', token] as const,
  },
  parts: {
    all: () => ['parts'] as const,
    list: (filters: PartFilters) => ['parts', 'list', filters] as const,
    /** Every part page's data (detail, readings, sweeps, fits, attachments). */
    details: () => ['parts', 'detail'] as const,
    detail: (id: number) => ['parts', 'detail', id] as const,
    readings: (id: number) => ['parts', 'detail', id, 'readings'] as const,
    sweeps: (id: number) => ['parts', 'detail', id, 'sweeps'] as const,
    fits: (id: number) => ['parts', 'detail', id, 'fits'] as const,
    attachments: (id: number) => ['parts', 'detail', id, 'attachments'] as const,
    byLabel: (label: string) => ['parts', 'by-label', label] as const,
    lookup: (scan: PartScan) => ['parts', 'lookup', scan] as const,
  },
  readings: {
    all: () => ['readings'] as const,
    recent: () => ['readings', 'recent'] as const,
  },
  profiles: {
    all: () => ['profiles'] as const,
    list: () => ['profiles', 'list'] as const,
  },
  instruments: {
    all: () => ['instruments'] as const,
    list: () => ['instruments', 'list'] as const,
  },
  harnesses: {
    all: () => ['harnesses'] as const,
    list: () => ['harnesses', 'list'] as const,
  },
  jobs: {
    all: () => ['jobs'] as const,
    list: () => ['jobs', 'list'] as const,
    detail: (id: number) => ['jobs', 'detail', id] as const,
    /** Under the job's key: installing or removing a part refreshes the preview too. */
    report: (id: number) => ['jobs', 'detail', id, 'report'] as const,
  },
  lots: {
    all: () => ['lots'] as const,
    list: () => ['lots', 'list'] as const,
    detail: (id: number, match: LotMatch) => ['lots', 'detail', id, match] as const,
    /** Under ['lots', 'detail', id] so that anything which refreshes the lot refreshes its items too. */
    items: (id: number, match: LotMatch) => ['lots', 'detail', id, 'items', match] as const,
    watcherCandidates: () => ['lots', 'watcher-candidates'] as const,
  },
  team: {
    all: () => ['team'] as const,
    members: () => ['team', 'members'] as const,
    invitations: () => ['team', 'invitations'] as const,
    labelClashes: () => ['team', 'label-clashes'] as const,
  },
  outbox: {
    all: () => ['outbox'] as const,
    list: () => ['outbox', 'list'] as const,
  },
  comparisons: {
    all: () => ['comparisons'] as const,
    list: () => ['comparisons', 'list'] as const,
    detail: (id: number) => ['comparisons', 'detail', id] as const,
  },
  compare: {
    candidates: () => ['compare', 'candidates'] as const,
    tapers: (req: TapersRequest) => ['compare', 'tapers', req] as const,
  },
};
