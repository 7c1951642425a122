// The jobs a pool worker runs (server/pool/worker.ts). Each takes plain data and returns plain data
// (structured-cloneable); the computing itself is shared/ code, called as it is. A worker that needs
// the database opens its own better-sqlite3 connection to the same file (WAL lets it read while the
// main thread writes) and closes it when the job ends.
import Database from 'better-sqlite3';
import { lotStatisticsOfBody, taperFitOfBody } from '@server/features/analysis/jobs';
import { coilFlags, fitCoil, type CoilFit, type CoilSpec, type CoilPoint } from '@shared/analysis/coil';
import { harnessResponse, instrumentResponses } from '@shared/audio/impulse';
import { pickupPositionOf, synthesizePhrase } from '@shared/audio/phrase';
import { renderChannels, renderPickupTracks } from '@shared/audio/render';
import { readWav, writeWav } from '@shared/audio/wav';
import { findBleed } from '@shared/circuit/bleed-finder';
import { getLayout, type LayoutConfig } from '@shared/circuit/layouts';
import { sweepKnobs } from '@shared/circuit/metrics';
import type { Netlist } from '@shared/circuit/netlist';
import { renderClips, type ClipRenderInput } from '@server/features/jobs/clips';
import { compress, jsonBytes, type Encoding } from '@server/http/encoded';
import { simulationAnswer, type SimulateInput } from '@server/features/harness/simulate';
import { storeOutboxMessage, type OutboxRecord } from '@server/mail/outbox-store';
import { workerWrite } from '@server/db/write-turns';
import {
  ingestSweep,
  partFitsJson,
  partSweepsJson,
  refitSweep,
  type SweepIngestInput,
  type SweepRefitInput,
} from '@server/features/sweeps/jobs';
import type { LotRow } from '@server/features/lots/repository';
import { lotValues } from '@server/features/lots/repository';
import { lotResults, readColumnBytes, refreshLotStats, type StoredLotResults } from '@server/features/lots/stored-stats';
import { withTransfer } from './transfer';
import { ingestLot, type LotIngestInput, type LotIngestResult } from '@server/features/lots/ingest';
import { encodeLotItems, freshItemsEncoded, type EncodedItems, type ItemsEncoding } from '@server/features/lots/items-encoded';
import { promoteToParts, type PromoteResult } from '@server/features/lots/promote';
import type { PromoteInput } from '@shared/schemas/lots';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import * as schema from '@server/db/schema';
import { lotExportCsv as buildLotExportCsv, type LotExportMatching } from '@server/features/lots/export-csv';
import {
  comparisonCsv as buildComparisonCsv,
  taperComparison,
  type ComparisonCsvInput,
  type TaperComparisonRequest,
} from '@server/features/compare/compute';

export interface HarnessSweepInput {
  netlist: Netlist;
  volume: number[];
  tone: number[];
  frequencies: number[];
  volumeKnob: string;
  toneKnob: string;
  knobs: Record<string, number>;
}

/**
 * POST /api/harness/sweep's answer as JSON bytes, compressed as the client accepts: the request thread
 * neither serialises nor compresses it.
 */
export function harnessSweepJson(input: HarnessSweepInput & { encoding: Encoding | null }): Uint8Array {
  const json = Buffer.from(JSON.stringify(harnessSweep(input)));
  return input.encoding ? compress(json, input.encoding) : json;
}

/** POST /api/harness/sweep: the knob grid, as the route answers it. */
export function harnessSweep(input: HarnessSweepInput) {
  const grid = sweepKnobs(input.netlist, { volume: input.volume, tone: input.tone }, input.frequencies, {
    volumeKnob: input.volumeKnob,
    toneKnob: input.toneKnob,
    knobs: input.knobs,
  });
  return {
    frequencies: Array.from(grid.frequencies),
    volumeKnob: input.volumeKnob,
    toneKnob: input.toneKnob,
    volume: grid.volume,
    tone: grid.tone,
    magnitudeDb: Array.from(grid.magnitudeDb),
    level1kDb: Array.from(grid.level1kDb),
    volumeTaperDb: Array.from(grid.volumeTaperDb),
    trebleRetentionDb: Array.from(grid.trebleRetentionDb),
    interactionIndexDb: grid.interactionIndexDb,
  };
}

export interface BleedFinderInput {
  layoutId: string;
  config: LayoutConfig;
  knobs: Record<string, number>;
  series: 'E12' | 'E24';
  weight: number;
}

/** POST /api/harness/bleed-finder: every preferred bleed network scored, the best first. */
export function bleedFinder(input: BleedFinderInput) {
  const layout = getLayout(input.layoutId);
  if (!layout) throw new RangeError(`Unknown layout ${input.layoutId}.`);
  return findBleed(layout, input.config, input.knobs, { series: input.series, weight: input.weight });
}

export interface RenderInput {
  netlist: Netlist;
  knobs: Record<string, number>;
  /** The built-in phrase (each pickup hears the string at its own place) … */
  phrase?: { sampleRate: number; seed?: number };
  /** … or a WAV file through the sum of the pickups' transfers, optionally divided by a recording chain's. */
  wav?: Uint8Array;
  chain?: { netlist: Netlist };
}

/** POST /api/harness/render: a 32-bit float WAV file. */
export function render(input: RenderInput): Uint8Array {
  const instrument = instrumentResponses(input.netlist, input.knobs);
  if (input.phrase) {
    const { sampleRate, seed } = input.phrase;
    const phrase = synthesizePhrase({
      sampleRate,
      seed,
      pickupPositions: instrument.pickups.map((p) => pickupPositionOf(p.pickupId)),
    });
    const out = renderPickupTracks(
      phrase.tracks,
      sampleRate,
      instrument.pickups.map((p) => p.response),
    );
    return writeWav([out], sampleRate, 'float32');
  }
  if (!input.wav) throw new RangeError('No recording to render.');
  const chain = input.chain ? harnessResponse(input.chain.netlist, { volume: 10, tone: 10 }) : undefined;
  const wav = readWav(input.wav);
  return writeWav(renderChannels(wav.channels, wav.sampleRate, instrument.total, chain), wav.sampleRate, 'float32');
}

export interface CoilFitInput {
  points: CoilPoint[];
  withRp?: boolean | 'auto';
  /** The part's limits, when the fit is judged (a sweep upload or a refit); none for the stateless route. */
  rules?: CoilSpec;
}

/** A coil fit (POST /api/analysis/coil, an impedance sweep's upload or refit), with its flags when judged. */
export function coilFit(input: CoilFitInput): CoilFit {
  const fit = fitCoil({ points: input.points, withRp: input.withRp ?? 'auto' });
  return input.rules ? { ...fit, flags: coilFlags(fit, input.rules) } : fit;
}

/** The database file a job reads (and, for stored statistics, writes). */
function openDb(file: string): Database.Database {
  const sqlite = new Database(file, { timeout: 5000, fileMustExist: true });
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('synchronous = FULL');
  return sqlite;
}

function withDb<T>(file: string, run: (sqlite: Database.Database) => T): T {
  const sqlite = openDb(file);
  try {
    return run(sqlite);
  } finally {
    sqlite.close();
  }
}

export interface LotStatsInput {
  dbFile: string;
  lot: LotRow;
}

/**
 * Computes a lot's stored statistics (stored-stats.ts) and keeps them, unless its readings changed
 * while they were computed (an upload or replace committed meanwhile): then nothing is kept and the
 * next read computes them again. Answers the results as computed.
 */
export function lotStats(input: LotStatsInput): StoredLotResults & { kept: boolean } {
  return withDb(input.dbFile, (sqlite) => {
    const r = refreshLotStats(sqlite, input.lot);
    return r.columns ? withTransfer(r, [r.columns.buffer as ArrayBuffer]) : r;
  });
}

export interface LotResultsInput extends LotStatsInput {
  matching: { matchPct?: number; setSize?: number };
  /** The detail needs the statistics only; the items route the columns too. */
  part?: 'detail' | 'columns';
}

/** A lot's results for another matching than the stored one, for one request (nothing kept). */
export function lotFreshResults(input: LotResultsInput): StoredLotResults {
  return withDb(input.dbFile, (sqlite) => {
    const r = lotResults(input.lot, lotValues(sqlite, input.lot.id), input.matching);
    const statsJson = JSON.stringify(r.stats);
    if (input.part !== 'columns') return { count: r.count, statsJson, columns: null };
    const columns = jsonBytes(r.columns);
    return withTransfer({ count: r.count, statsJson, columns }, [columns.buffer as ArrayBuffer]);
  });
}

/**
 * A lot upload's parse, insert (one transaction on the worker's own connection, the file moved into place
 * as its last step) and statistics (server/features/lots/ingest.ts).
 */
export function lotIngest(input: LotIngestInput): Promise<LotIngestResult> {
  return ingestLot(input);
}

/** The items answer of another matching than the stored one, compressed, for one request (items-encoded.ts). */
export function lotFreshItemsEncoded(input: LotResultsInput & { encoding: ItemsEncoding }): Uint8Array {
  return withDb(input.dbFile, (sqlite) => freshItemsEncoded(sqlite, input.lot, input.matching, input.encoding));
}

/** A lot's items answer compressed (gzip, brotli) and kept beside its stored columns (items-encoded.ts). */
export function lotItemsEncode(input: { dbFile: string; lotId: number }): EncodedItems | null {
  return withDb(input.dbFile, (sqlite) => encodeLotItems(sqlite, input.lotId));
}

/**
 * A lot's stored item columns as bytes, read here rather than on the request thread (9 MB out of SQLite
 * takes tens of milliseconds), and moved, not copied, to it.
 */
export function lotColumnBytes(input: { dbFile: string; lotId: number }): { count: number; computedAt: number; bytes: Uint8Array } | null {
  return withDb(input.dbFile, (sqlite) => {
    const read = readColumnBytes(sqlite, input.lotId);
    if (!read) return null;
    // A copy of the database's buffer, which this thread owns and can give away.
    const bytes = new Uint8Array(read.bytes);
    return withTransfer({ count: read.count, computedAt: read.computedAt, bytes }, [bytes.buffer]);
  });
}

export interface LotExportInput extends LotStatsInput {
  matching: LotExportMatching;
  /** When the export was asked for (ms since 1970): the file's `made` line. */
  madeAt: number;
}

/** A lot's CSV file (server/features/lots/export-csv.ts) as UTF-8 bytes. */
export function lotExportCsv(input: LotExportInput): Uint8Array {
  return withDb(input.dbFile, (sqlite) =>
    new TextEncoder().encode(buildLotExportCsv(sqlite, input.lot, input.matching, new Date(input.madeAt))),
  );
}

export interface LotPromoteInput {
  dbFile: string;
  lot: LotRow;
  input: PromoteInput;
  userId: string;
}

/** Items of a lot become parts (server/features/lots/promote.ts), written through this worker's connection. */
export function lotPromote({ dbFile, lot, input, userId }: LotPromoteInput): PromoteResult {
  return withDb(dbFile, (sqlite) => promoteToParts({ db: drizzle(sqlite, { schema }), sqlite }, lot, input, userId));
}

/** A sweep upload: parse, fit and store (server/features/sweeps/jobs.ts); the answer as JSON text. */
export function sweepIngest(input: SweepIngestInput): Uint8Array {
  return withDb(input.dbFile, (sqlite) => ingestSweep(sqlite, input));
}

/** A part's sweeps with their points and current fits, as JSON text. */
export function partSweeps(input: { dbFile: string; partId: number }): Uint8Array {
  return withDb(input.dbFile, (sqlite) => partSweepsJson(sqlite, input.partId));
}

/** A part's fits, superseded ones included, as JSON text. */
export function partFits(input: { dbFile: string; partId: number }): Uint8Array {
  return withDb(input.dbFile, (sqlite) => partFitsJson(sqlite, input.partId));
}

/** A stored sweep fitted again with the current engine, stored beside the older fits. */
export function sweepRefit(input: SweepRefitInput) {
  return withDb(input.dbFile, (sqlite) => refitSweep(sqlite, input));
}

/** A large built message written to the outbox (server/mail/outbox-store.ts). */
export function outboxStore(input: { dbFile: string; record: OutboxRecord }): void {
  withDb(input.dbFile, (sqlite) => workerWrite(() => storeOutboxMessage(drizzle(sqlite, { schema }), input.record)));
}

/** POST /api/harness/simulate for a large design (server/features/harness/simulate.ts). */
export function harnessSimulate(input: SimulateInput) {
  return simulationAnswer(input);
}

/** POST /api/analysis/taper: a taper fit of up to 20,000 points. */
export function taperFit(input: { body: Uint8Array }) {
  return taperFitOfBody(input.body);
}

/** POST /api/analysis/lot: a lot's statistics for up to 200,000 values, as the JSON text of the answer. */
export function lotStatisticsJson(input: { body: Uint8Array }): Uint8Array {
  return lotStatisticsOfBody(input.body);
}

/** A job's report clips (server/features/jobs/clips.ts): the before and after designs as two 16-bit WAV files. */
export function reportClips(input: ClipRenderInput): [Uint8Array, Uint8Array] {
  return renderClips(input);
}

export interface CompareTapersInput {
  dbFile: string;
  request: TaperComparisonRequest;
  encoding: Encoding | null;
}

/** POST /api/compare/tapers (server/features/compare/compute.ts): the answer as JSON bytes, compressed as the client accepts. */
export function compareTapersJson(input: CompareTapersInput): Uint8Array {
  return withDb(input.dbFile, (sqlite) => {
    const json = Buffer.from(JSON.stringify(taperComparison(sqlite, input.request)));
    return input.encoding ? compress(json, input.encoding) : json;
  });
}

/** GET /api/comparisons/:id/export.csv (server/features/compare/compute.ts) as UTF-8 bytes. */
export function comparisonCsv(input: ComparisonCsvInput & { dbFile: string }): Uint8Array {
  return withDb(input.dbFile, (sqlite) => new TextEncoder().encode(buildComparisonCsv(sqlite, input)));
}

/** Every job by name: the pool's typed front (server/pool/index.ts) takes its types from here. */
export const TASKS = {
  harnessSweep,
  harnessSweepJson,
  bleedFinder,
  render,
  coilFit,
  lotStats,
  lotFreshResults,
  reportClips,
  lotIngest,
  lotItemsEncode,
  lotColumnBytes,
  lotFreshItemsEncoded,
  lotExportCsv,
  lotPromote,
  taperFit,
  lotStatisticsJson,
  harnessSimulate,
  sweepIngest,
  partSweeps,
  sweepRefit,
  partFits,
  outboxStore,
  compareTapersJson,
  comparisonCsv,
} as const;
export type TaskName = keyof typeof TASKS;
