// The whole data model. Values are stored in SI units as REAL, the unit implied by the quantity
// (ohm, farad, henry, hertz). Times are integer milliseconds since the epoch unless a column
// says otherwise (lucia's session expiry is in seconds, as its adapter writes it).
import { sql } from 'drizzle-orm';
import { blob, index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
// Relative imports: drizzle-kit loads this file without the tsconfig path aliases.
import { INSTRUMENT_KINDS } from '../../shared/schemas/bench';
import { PART_KINDS, PART_STATUSES, ROLES, VERDICTS, type PartStatus } from '../../shared/schemas/common';
import type { HarnessDesign } from '../../shared/schemas/harness';
import { JOB_STATUSES } from '../../shared/schemas/jobs';
import type { BeforeDesign, RecordingChain } from '../../shared/schemas/job-clips';
import { LOT_STATUSES, type SecondQuantity } from '../../shared/schemas/lots';
import { FIT_KINDS, SWEEP_KINDS, type Fit } from '../../shared/schemas/sweeps';
import { TAPER_LAWS } from '../../shared/taper/law';

const createdAt = () =>
  integer('created_at')
    .notNull()
    .default(sql`(cast(unixepoch('subsec') * 1000 as integer))`);

export const users = sqliteTable('users', {
  id: text('id').primaryKey(),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  role: text('role', { enum: ROLES }).notNull(),
  passwordHash: text('password_hash').notNull(),
  disabledAt: integer('disabled_at'),
  createdAt: createdAt(),
});

export const sessions = sqliteTable('sessions', {
  id: text('id').primaryKey(),
  userId: text('user_id')
    .notNull()
    .references(() => users.id, { onDelete: 'cascade' }),
  /** Seconds since the epoch (lucia's adapter writes it so). */
  expiresAt: integer('expires_at').notNull(),
  /** Milliseconds; the absolute lifetime counts from here (lucia only has an idle lifetime). */
  createdAt: integer('created_at').notNull(),
});

export const invitations = sqliteTable('invitations', {
  id: text('id').primaryKey(),
  email: text('email').notNull(),
  role: text('role', { enum: ROLES }).notNull(),
  tokenHash: text('token_hash').notNull().unique(),
  invitedBy: text('invited_by').references(() => users.id, { onDelete: 'set null' }),
  expiresAt: integer('expires_at').notNull(),
  acceptedAt: integer('accepted_at'),
  revokedAt: integer('revoked_at'),
  createdAt: createdAt(),
});

export const passwordResets = sqliteTable('password_resets', {
  id: text('id').primaryKey(),
  userId: text('user_id')
    .notNull()
    .references(() => users.id, { onDelete: 'cascade' }),
  tokenHash: text('token_hash').notNull().unique(),
  expiresAt: integer('expires_at').notNull(),
  usedAt: integer('used_at'),
  createdAt: createdAt(),
});

export const toleranceProfiles = sqliteTable('tolerance_profiles', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull().unique(),
  kind: text('kind', { enum: PART_KINDS }).notNull(),
  /** Optional nominal range (SI) the profile applies to; null = any nominal of the kind. */
  nominalMin: real('nominal_min'),
  nominalMax: real('nominal_max'),
  tolerancePct: real('tolerance_pct').notNull(),
  /** Kind-specific rules (taper class, m range, end resistance, dissipation factor, …) as JSON. */
  rules: text('rules', { mode: 'json' }).notNull().$type<Record<string, unknown>>().default({}),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
});

export const instruments = sqliteTable('instruments', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull().unique(),
  kind: text('kind', { enum: INSTRUMENT_KINDS }).notNull(),
  serial: text('serial'),
  /** Accuracy per quantity: { resistance: { pctOfReading, counts, resolution }, … } as JSON. */
  accuracy: text('accuracy', { mode: 'json' }).notNull().$type<Record<string, unknown>>().default({}),
  /** Display counts (e.g. 6000); null when not recorded (then each accuracy's fixed resolution is used). */
  displayCounts: integer('display_counts'),
  /** ISO date (YYYY-MM-DD). */
  calibrationDue: text('calibration_due'),
  notes: text('notes'),
  createdAt: createdAt(),
});

export const lots = sqliteTable('lots', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  code: text('code').notNull().unique(),
  kind: text('kind', { enum: PART_KINDS }).notNull(),
  quantity: text('quantity').notNull(),
  nominal: real('nominal').notNull(),
  /** Tolerance below nominal (−), percent; also above it unless tolerancePlusPct differs. */
  tolerancePct: real('tolerance_pct').notNull(),
  /** Tolerance above nominal (+), percent: 80 on a Z lot (−20 %/+80 %); equal to tolerancePct when symmetric. */
  tolerancePlusPct: real('tolerance_plus_pct'),
  marking: text('marking'),
  supplier: text('supplier'),
  receivedOn: text('received_on'),
  expectedCount: integer('expected_count'),
  secondQuantity: text('second_quantity').$type<SecondQuantity>(),
  secondLimit: real('second_limit'),
  /** The meter the lot was measured with and its test frequency (Hz): carried to promoted parts' readings. */
  instrumentId: integer('instrument_id').references(() => instruments.id, { onDelete: 'set null' }),
  testFrequency: real('test_frequency'),
  status: text('status', { enum: LOT_STATUSES }).notNull().default('open'),
  dispositionReason: text('disposition_reason'),
  disposedBy: text('disposed_by').references(() => users.id, { onDelete: 'set null' }),
  disposedAt: integer('disposed_at'),
  notes: text('notes'),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  /**
   * How many lot_readings rows the lot has, kept so the lot list reads it instead of counting 100,000
   * rows per lot on every request. Written in the transaction that inserts or replaces the readings
   * (the lot ingest, the demo seed); migration 0015 filled it for lots stored before.
   */
  readingCount: integer('reading_count').notNull().default(0),
});

export const lotReadings = sqliteTable(
  'lot_readings',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    lotId: integer('lot_id')
      .notNull()
      .references(() => lots.id, { onDelete: 'cascade' }),
    item: text('item').notNull(),
    value: real('value').notNull(),
    secondValue: real('second_value'),
    frequency: real('frequency'),
    /** Row number in the uploaded file (1-based, header excluded) for messages. */
    sourceRow: integer('source_row'),
  },
  (t) => [index('lot_readings_lot_idx').on(t.lotId)],
);

/**
 * A lot's statistics as of its current readings and limits (server/features/lots/stored-stats.ts),
 * kept so reads do not recompute them: the detail answer (without the per-item columns) as JSON text.
 * Deleted in the transaction that changes the readings; a row of another engine version is recomputed
 * on its next read. The items' columns and the compressed items answer are kept in tables of their own
 * (below): in this row, megabytes before `computed_at` made every read of the small fields walk them.
 */
export const lotStats = sqliteTable('lot_stats', {
  lotId: integer('lot_id')
    .primaryKey()
    .references(() => lots.id, { onDelete: 'cascade' }),
  engineVersion: text('engine_version').notNull(),
  /** The nominal and tolerance the figures were computed against (a change of limits recomputes). */
  nominal: real('nominal').notNull(),
  tolerancePct: real('tolerance_pct').notNull(),
  tolerancePlusPct: real('tolerance_plus_pct'),
  secondLimit: real('second_limit'),
  count: integer('count').notNull(),
  detail: text('detail').notNull(),
  computedAt: integer('computed_at').notNull(),
});

/** The items route's columns of a lot's stored statistics, as JSON text (~9 MB for 100,000 items). */
export const lotStatsColumns = sqliteTable('lot_stats_columns', {
  lotId: integer('lot_id')
    .primaryKey()
    .references(() => lots.id, { onDelete: 'cascade' }),
  columns: text('columns').notNull(),
});

/**
 * The items answer (partIds and the stored columns) compressed once in the pool, gzip and brotli, for
 * the lot's state `mark` names (computed_at, count and the promoted parts); deleted by an upload, a
 * refresh of the statistics and a promotion (server/features/lots/items-encoded.ts).
 */
export const lotItemsEncoded = sqliteTable('lot_items_encoded', {
  lotId: integer('lot_id')
    .primaryKey()
    .references(() => lots.id, { onDelete: 'cascade' }),
  mark: text('mark').notNull(),
  gzip: blob('gzip', { mode: 'buffer' }).notNull(),
  br: blob('br', { mode: 'buffer' }).notNull(),
});

export const lotWatchers = sqliteTable(
  'lot_watchers',
  {
    lotId: integer('lot_id')
      .notNull()
      .references(() => lots.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
  },
  (t) => [primaryKey({ columns: [t.lotId, t.userId] })],
);

export const parts = sqliteTable(
  'parts',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    kind: text('kind', { enum: PART_KINDS }).notNull(),
    label: text('label').notNull(),
    nominal: real('nominal'),
    /** Tolerance below nominal (−), percent; also above it unless tolerancePlusPct differs. */
    tolerancePct: real('tolerance_pct'),
    /** Tolerance above nominal (+), percent (80 on a Z part); equal to tolerancePct when symmetric, null with it. */
    tolerancePlusPct: real('tolerance_plus_pct'),
    marking: text('marking'),
    /** For pots: 'linear' | 'audio' | 'reverse' | 'two-segment' with the class's mid-rotation m. */
    taperClass: text('taper_class', { enum: TAPER_LAWS }),
    taperM: real('taper_m'),
    supplier: text('supplier'),
    lotId: integer('lot_id').references(() => lots.id, { onDelete: 'set null' }),
    lotItem: text('lot_item'),
    profileId: integer('profile_id').references(() => toleranceProfiles.id, { onDelete: 'set null' }),
    status: text('status', { enum: PART_STATUSES }).notNull().default('incoming'),
    statusReason: text('status_reason'),
    tags: text('tags'),
    notes: text('notes'),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: integer('updated_at'),
  },
  // Labels are unique in any case: the server checks lower(label) before every insert and rename
  // (a unique index on it would refuse to build where older labels differ only in case; those are
  // listed at start and on the Team screen instead of being renamed).
  (t) => [
    uniqueIndex('parts_label_unique').on(t.label),
    index('parts_label_lower_idx').on(sql`lower(${t.label})`),
    index('parts_lot_idx').on(t.lotId),
  ],
);

export const partStatusEvents = sqliteTable('part_status_events', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  partId: integer('part_id')
    .notNull()
    .references(() => parts.id, { onDelete: 'cascade' }),
  // Type only (no SQL change): the statuses written are the part statuses of shared/schemas/common.ts.
  fromStatus: text('from_status').$type<PartStatus>(),
  toStatus: text('to_status').notNull().$type<PartStatus>(),
  reason: text('reason'),
  userId: text('user_id').references(() => users.id, { onDelete: 'set null' }),
  at: createdAt(),
});

export const readings = sqliteTable(
  'readings',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    partId: integer('part_id')
      .notNull()
      .references(() => parts.id, { onDelete: 'cascade' }),
    quantity: text('quantity').notNull(),
    value: real('value').notNull(),
    frequency: real('frequency'),
    instrumentId: integer('instrument_id').references(() => instruments.id, { onDelete: 'set null' }),
    /** True when the instrument's calibration was overdue on the day of the reading. */
    calibrationOverdue: integer('calibration_overdue', { mode: 'boolean' }).notNull().default(false),
    uncertainty: real('uncertainty'),
    verdict: text('verdict', { enum: VERDICTS }),
    verdictReason: text('verdict_reason'),
    entry: text('entry', { enum: ['typed', 'file', 'lot'] })
      .notNull()
      .default('typed'),
    takenBy: text('taken_by').references(() => users.id, { onDelete: 'set null' }),
    takenAt: createdAt(),
  },
  (t) => [index('readings_part_idx').on(t.partId)],
);

export const attachments = sqliteTable('attachments', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  ownerType: text('owner_type', { enum: ['part', 'lot', 'job'] }).notNull(),
  ownerId: integer('owner_id').notNull(),
  /** `recording`: a job's direct-input WAV recording of the customer's instrument (the source of the report's clips). */
  purpose: text('purpose', { enum: ['sweep', 'lot-readings', 'photo', 'certificate', 'recording'] }).notNull(),
  originalName: text('original_name').notNull(),
  /** sha256 of the content; the file on disk is named after it, never after the user's name. */
  contentHash: text('content_hash').notNull(),
  mime: text('mime').notNull(),
  size: integer('size').notNull(),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
});

export const sweeps = sqliteTable('sweeps', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  partId: integer('part_id')
    .notNull()
    .references(() => parts.id, { onDelete: 'cascade' }),
  kind: text('kind', { enum: SWEEP_KINDS }).notNull(),
  attachmentId: integer('attachment_id').references(() => attachments.id, { onDelete: 'set null' }),
  /** How the file's columns were understood: { rotation: 'Angle (°)', … } as JSON. */
  columns: text('columns', { mode: 'json' }).$type<Record<string, string>>(),
  pointCount: integer('point_count').notNull(),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
});

/** Taper: x = rotation fraction, y = R(lug 1–wiper), z = R(wiper–lug 3).
 *  Impedance: x = frequency, y = real part, z = imaginary part (ohm). */
export const sweepPoints = sqliteTable(
  'sweep_points',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    sweepId: integer('sweep_id')
      .notNull()
      .references(() => sweeps.id, { onDelete: 'cascade' }),
    idx: integer('idx').notNull(),
    x: real('x').notNull(),
    y: real('y').notNull(),
    z: real('z'),
    /** Taper only: R13 (lug 1 to lug 3) measured beside the reading, Ω; null when not measured. */
    total: real('total'),
  },
  (t) => [index('sweep_points_sweep_idx').on(t.sweepId)],
);

export const fits = sqliteTable(
  'fits',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    partId: integer('part_id')
      .notNull()
      .references(() => parts.id, { onDelete: 'cascade' }),
    sweepId: integer('sweep_id').references(() => sweeps.id, { onDelete: 'cascade' }),
    kind: text('kind', { enum: FIT_KINDS }).notNull(),
    engineVersion: text('engine_version').notNull(),
    /** The engine's whole result (parameters, quality figures, flags) as JSON. */
    result: text('result', { mode: 'json' }).notNull().$type<Fit['result']>(),
    flagged: integer('flagged', { mode: 'boolean' }).notNull().default(false),
    /** Set when a newer fit of the same sweep replaced it; the old result stays as history. */
    supersededAt: integer('superseded_at'),
    createdAt: createdAt(),
  },
  (t) => [index('fits_part_idx').on(t.partId)],
);

export const harnesses = sqliteTable('harnesses', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull(),
  /** The whole instrument: layout id, selector position, option choices, knob settings. */
  layout: text('layout').notNull().default('one-pickup'),
  selector: integer('selector').notNull().default(0),
  options: text('options', { mode: 'json' }).notNull().default({}).$type<Record<string, string>>(),
  knobs: text('knobs', { mode: 'json' }).$type<Record<string, number>>(),
  /** The preset a design was first saved from (older designs); null for designs saved as a layout. */
  preset: text('preset').$type<NonNullable<HarnessDesign['preset']>>(),
  values: text('values', { mode: 'json' }).notNull().$type<HarnessDesign['values']>(),
  /** Measured parts whose values feed this design: { volumePot: partId, … } as JSON. */
  partRefs: text('part_refs', { mode: 'json' }).$type<Record<string, number>>(),
  notes: text('notes'),
  ownerId: text('owner_id').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  updatedAt: integer('updated_at'),
});

export const jobs = sqliteTable('jobs', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  code: text('code').notNull().unique(),
  customer: text('customer').notNull(),
  customerEmail: text('customer_email'),
  instrument: text('instrument').notNull(),
  status: text('status', { enum: JOB_STATUSES }).notNull().default('open'),
  harnessId: integer('harness_id').references(() => harnesses.id, { onDelete: 'set null' }),
  /**
   * The wiring the instrument had before the work: a saved design, or (`before_design`) a design body
   * kept with the job. No foreign key: drizzle-kit adds a column's reference without its ON DELETE
   * rule, so deleting the design would be refused; ids are never reused (AUTOINCREMENT), and a
   * deleted design reads as "no longer saved" (server/features/jobs/clips.ts).
   */
  beforeHarnessId: integer('before_harness_id'),
  beforeDesign: text('before_design', { mode: 'json' }).$type<BeforeDesign>(),
  /** How the job's recording was made (recorder input Ω, cable m); null: the defaults, 1 MΩ and 3 m. */
  recordingChain: text('recording_chain', { mode: 'json' }).$type<RecordingChain>(),
  notes: text('notes'),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  updatedAt: integer('updated_at'),
});

export const jobParts = sqliteTable(
  'job_parts',
  {
    jobId: integer('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    partId: integer('part_id')
      .notNull()
      .references(() => parts.id, { onDelete: 'restrict' }),
    position: text('position').notNull(),
    /** Why a flagged or never-judged part went in anyway (the tech's words), or null. */
    overrideReason: text('override_reason'),
    /**
     * The slot of the job's wiring design this part fills (shared/circuit/slots.ts: 'volumeR',
     * 'neck.toneC', 'north.pickup' …), or null; the report's predictions use its measured values.
     */
    slot: text('slot'),
    installedBy: text('installed_by').references(() => users.id, { onDelete: 'set null' }),
    installedAt: createdAt(),
  },
  // One part per slot of a job (SQLite lets any number of rows hold a null slot).
  (t) => [primaryKey({ columns: [t.jobId, t.partId] }), uniqueIndex('job_parts_slot_idx').on(t.jobId, t.slot)],
);

export const comparisons = sqliteTable('comparisons', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull(),
  /** The selection: filters and explicit part ids, as JSON. */
  selection: text('selection', { mode: 'json' }).notNull().$type<Record<string, unknown>>(),
  settings: text('settings', { mode: 'json' }).$type<Record<string, unknown>>(),
  /** What the comparison is for and what it showed, in the author's words. */
  notes: text('notes'),
  ownerId: text('owner_id').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  updatedAt: integer('updated_at'),
});

export const outbox = sqliteTable('outbox', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  to: text('to').notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
  /** Why it was sent: invitation, password-reset, lot-disposition, customer-report. */
  topic: text('topic').notNull(),
  /** The full message as nodemailer built it (RFC 5322 source). */
  raw: text('raw'),
  transport: text('transport', { enum: ['outbox', 'smtp'] }).notNull(),
  sentAt: integer('sent_at'),
  error: text('error'),
  createdAt: createdAt(),
});

/** The attachments of an outbox message, as they went out (name, type, bytes). */
export const outboxAttachments = sqliteTable(
  'outbox_attachments',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    messageId: integer('message_id')
      .notNull()
      .references(() => outbox.id, { onDelete: 'cascade' }),
    filename: text('filename').notNull(),
    contentType: text('content_type').notNull(),
    size: integer('size').notNull(),
    content: blob('content', { mode: 'buffer' }).notNull(),
  },
  (t) => [index('outbox_attachments_message_idx').on(t.messageId)],
);

export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: text('user_id').references(() => users.id, { onDelete: 'set null' }),
    action: text('action').notNull(),
    entity: text('entity').notNull(),
    entityId: text('entity_id'),
    detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>(),
    at: createdAt(),
  },
  (t) => [index('audit_log_entity_idx').on(t.entity, t.entityId)],
);
