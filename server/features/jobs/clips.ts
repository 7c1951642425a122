// The customer report's before/after clips (Listen for the customer): two WAV files, 16-bit mono,
// at most 10 s each, rendered through the job's wiring before the work and its design after it, at
// the same knob settings. The source is the customer's own direct-input recording attached to the
// job (its latest WAV with purpose "recording"), filtered by H(design)/H(recording chain) as the
// Listen panel does (boost at most +12 dB), else the built-in plucked-string phrase with each
// pickup hearing the string at its own place. Both clips go through one common gain, so the level
// difference between them is the wiring's.
//
// `reportClips` is the one hook the report and send paths call: it returns the paragraph the e-mail
// gets and, on demand, the attachments (rendering only when the message is really sent).
import fs from 'node:fs';
import { and, desc, eq } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { attachments, harnesses } from '@server/db/schema';
import { contentPath } from '@server/uploads/store';
import { carryKnobs } from '@shared/audio/carry-knobs';
import { harnessResponse, instrumentResponses, type InstrumentResponses } from '@shared/audio/impulse';
import { phraseFrames, pickupPositionOf, synthesizePhrase } from '@shared/audio/phrase';
import { MAX_CHAIN_BOOST_DB, renderChannels, renderPickupTracks } from '@shared/audio/render';
import { readWav, readWavHeader, WavError, writeWav } from '@shared/audio/wav';
import { buildLayoutNetlist, getLayout, layoutKnobs, resolveLayoutConfig, type LayoutDef } from '@shared/circuit/layouts';
import type { Netlist } from '@shared/circuit/netlist';
import { CLIP_MAX_SECONDS, type BeforeDesign, type RecordingChain } from '@shared/schemas/job-clips';
import { RECORDING_CHAIN_DEFAULTS } from '@shared/schemas/listen';
import { formatValue } from '@shared/units/format';
import type { ReportAttachmentSource } from './report';
import type { JobDetail } from './repository';

/** The sample rate of clips made from the built-in phrase. */
export const CLIP_PHRASE_RATE = 48000;
/** The louder clip's peak after the common gain: −6 dBFS. */
export const CLIP_PEAK = 10 ** (-6 / 20);
/** The common gain never raises the clips by more than this (a near-silent pair stays quiet). */
const MAX_GAIN = 10 ** (24 / 20);

export interface ClipAttachment {
  filename: string;
  content: Buffer;
  contentType: string;
}

export interface ReportClips {
  /** The e-mail's paragraph about the clips (which is which, the source, the caution), or null when the job has no before wiring. */
  text: string | null;
  /** The two WAV files, rendered when called (in the job pool when the caller runs it there); empty when no clips can be made. */
  attachments: (render?: ClipRenderer) => Promise<ClipAttachment[]>;
}

/** Both designs' netlists and knobs, the recording chain and the source: all a worker needs to render the clips. */
export interface ClipRenderInput {
  before: { netlist: Netlist; knobs: Record<string, number> };
  after: { netlist: Netlist; knobs: Record<string, number> };
  /** The recording's WAV bytes and its chain (the before wiring into the recorder); absent: the built-in phrase. */
  recording?: { wav: Uint8Array; chain: { netlist: Netlist; knobs: Record<string, number> } };
}

/** Renders the before and after clips as 16-bit WAV bytes (the pool's `reportClips` job, or inline). */
export type ClipRenderer = (input: ClipRenderInput) => Promise<[Uint8Array, Uint8Array]>;

interface Wiring {
  label: string;
  layout: LayoutDef;
  config: ReturnType<typeof resolveLayoutConfig>['config'];
}

type DesignShape = Pick<BeforeDesign, 'layout' | 'selector' | 'options' | 'values' | 'knobs'>;

function wiringOf(label: string, d: DesignShape): Wiring | string {
  const layout = getLayout(d.layout);
  if (!layout) return `${label}: unknown layout "${d.layout}"`;
  const { config, problems } = resolveLayoutConfig(layout, { selector: d.selector, options: d.options, values: d.values });
  if (problems.length > 0) return `${label}: ${problems[0]!.message}`;
  return { label, layout, config };
}

const knobWords = (layout: LayoutDef, knobs: Record<string, number>) =>
  layout.knobs.map((k) => `${k.name.toLowerCase()} ${knobs[k.id]}`).join(', ');

const wiringWords = (w: Wiring) => {
  const pos = w.layout.selector.positions.length > 1 ? `, selector at ${w.layout.selector.positions[w.config.selector]!.name}` : '';
  return `${w.label} (${w.layout.name}${pos})`;
};

/** The job's latest WAV recording, if any. */
function latestRecording(db: DbLike, jobId: number) {
  return db
    .select()
    .from(attachments)
    .where(and(eq(attachments.ownerType, 'job'), eq(attachments.ownerId, jobId), eq(attachments.purpose, 'recording')))
    .orderBy(desc(attachments.id))
    .get();
}

/** The recording chain: the before wiring at full volume and tone into the recorder's input (an amplifier-like load) through its cable. */
function chainOf(before: Wiring, chain: RecordingChain) {
  const options = { ...before.config.options, ...(before.layout.options.some((o) => o.id === 'load') ? { load: 'amp' } : {}) };
  const { config } = resolveLayoutConfig(before.layout, {
    selector: before.config.selector,
    options,
    values: { ...before.config.values, ampR: chain.inputR, cableLength: chain.cableLength },
  });
  return { netlist: buildLayoutNetlist(before.layout, config), knobs: layoutKnobs(before.layout, {}) };
}

/** Mono (channels averaged), at most `seconds` long. */
function monoHead(channels: Float32Array[], sampleRate: number, seconds: number): Float32Array {
  const n = Math.min(channels[0]!.length, Math.round(seconds * sampleRate));
  const out = new Float32Array(n);
  for (const ch of channels) for (let i = 0; i < n; i++) out[i]! += ch[i]! / channels.length;
  return out;
}

/**
 * The paragraph and the clips for a job's report. `uploadsDir` is where the job's recording is stored.
 */
export async function reportClips(db: DbLike, uploadsDir: string, job: JobDetail): Promise<ReportClips> {
  const none = (text: string | null): ReportClips => ({ text, attachments: () => Promise.resolve([]) });
  const hasBefore = job.beforeHarnessId != null || job.beforeDesign != null;
  if (!hasBefore) return none(null);
  const noClips = (why: string) => none(`Sound clips: none attached (${why}).`);
  if (!job.harnessId) return noClips('the job has no design for the wiring after the work');
  const afterRow = db.select().from(harnesses).where(eq(harnesses.id, job.harnessId)).get();
  if (!afterRow) return noClips('the design after the work is no longer saved');
  let beforeShape: DesignShape & { name: string };
  if (job.beforeHarnessId != null) {
    const row = db.select().from(harnesses).where(eq(harnesses.id, job.beforeHarnessId)).get();
    if (!row) return noClips('the saved design of the wiring before the work is no longer saved');
    beforeShape = row;
  } else {
    beforeShape = { ...job.beforeDesign!, name: job.beforeDesign!.name ?? 'the wiring before the work' };
  }
  const after = wiringOf(afterRow.name, afterRow);
  const before = wiringOf(beforeShape.name, beforeShape);
  if (typeof before === 'string') return noClips(`the wiring before the work cannot be computed: ${before}`);
  if (typeof after === 'string') return noClips(`the wiring after the work cannot be computed: ${after}`);
  const afterKnobs = layoutKnobs(after.layout, afterRow.knobs ?? {});
  const beforeKnobs = carryKnobs(after.layout, afterKnobs, before.layout);

  const recording = latestRecording(db, job.id);
  const chain: RecordingChain = job.recordingChain ?? { ...RECORDING_CHAIN_DEFAULTS };
  let source: { kind: 'recording'; bytes: Uint8Array; name: string; seconds: number; rate: number } | { kind: 'phrase' } = {
    kind: 'phrase',
  };
  let sourceNote = '';
  if (recording) {
    try {
      // Read by the thread pool (up to 10 MB), and later moved, not copied, to the worker that renders.
      const file = await fs.promises.readFile(contentPath(uploadsDir, recording.contentHash));
      const bytes = new Uint8Array(file.buffer, file.byteOffset, file.byteLength);
      const h = readWavHeader(bytes);
      source = { kind: 'recording', bytes, name: recording.originalName, seconds: h.frames / h.sampleRate, rate: h.sampleRate };
    } catch (e) {
      sourceNote = ` The recording "${recording.originalName}" could not be read (${e instanceof WavError ? e.message : 'file missing'}), so the built-in phrase was used.`;
    }
  }
  const code = job.code;
  const names = { before: `${code}-1-before.wav`, after: `${code}-2-after.wav` };
  const same = knobWords(before.layout, beforeKnobs) === knobWords(after.layout, afterKnobs);
  const length = source.kind === 'recording' ? Math.min(source.seconds, CLIP_MAX_SECONDS) : Math.min(phraseSeconds(), CLIP_MAX_SECONDS);
  const lines = [
    `Sound clips: two are attached (WAV, 16-bit mono, ${length.toFixed(1)} s each), so you can hear the change.`,
    `  ${names.before}: the wiring before the work, ${wiringWords(before)}, knobs ${knobWords(before.layout, beforeKnobs)}.`,
    `  ${names.after}: the wiring after the work, ${wiringWords(after)}, knobs ${knobWords(after.layout, afterKnobs)}${same ? ' (the same settings)' : ' (the same volume and tone settings)'}.`,
    source.kind === 'recording'
      ? `  Source: your own recording "${source.name}"${source.seconds > CLIP_MAX_SECONDS ? ` (its first ${CLIP_MAX_SECONDS} s)` : ''}, filtered by each wiring divided by the wiring it was recorded through (the wiring before the work at full volume and tone into a ${formatValue(chain.inputR, 'Ω')} input through ${chain.cableLength} m of cable), with at most +${MAX_CHAIN_BOOST_DB} dB of boost.`
      : `  Source: a phrase of plucked strings synthesised by Lugbook (no recording), each pickup hearing the string at its own place.${sourceNote}`,
    "  Both clips went through the same gain, so the difference you hear is the wiring's. They are predictions from a circuit model, not recordings of the finished instrument.",
    '  Start quiet: set your speakers or headphones low before playing them and raise them slowly; loud sound, above all through headphones, harms hearing for good.',
  ];

  const input: ClipRenderInput = {
    before: { netlist: buildLayoutNetlist(before.layout, before.config), knobs: beforeKnobs },
    after: { netlist: buildLayoutNetlist(after.layout, after.config), knobs: afterKnobs },
    ...(source.kind === 'recording' ? { recording: { wav: source.bytes, chain: chainOf(before, chain) } } : {}),
  };
  const attachmentsOf = async (render: ClipRenderer = (i) => Promise.resolve(renderClips(i))): Promise<ClipAttachment[]> => {
    const [b, a] = await render(input);
    return [
      { filename: names.before, content: Buffer.from(b.buffer, b.byteOffset, b.byteLength), contentType: 'audio/wav' },
      { filename: names.after, content: Buffer.from(a.buffer, a.byteOffset, a.byteLength), contentType: 'audio/wav' },
    ];
  };
  return { text: lines.join('\n'), attachments: attachmentsOf };
}

/** The phrase's length, known without synthesising it (that takes ~0.1 s, in the worker that renders the clips). */
function phraseSeconds(): number {
  return phraseFrames({ sampleRate: CLIP_PHRASE_RATE }) / CLIP_PHRASE_RATE;
}

let cached: ReturnType<typeof synthesizePhrase> | null = null;
/** The phrase at the clip rate with a track for every pickup place (neck, middle, bridge); made once. */
function synthesizePhraseCached() {
  cached ??= synthesizePhrase({
    sampleRate: CLIP_PHRASE_RATE,
    pickupPositions: [pickupPositionOf('neck'), pickupPositionOf('middle'), pickupPositionOf('bridge')],
  });
  return cached;
}

/** Both designs through the phrase: each pickup fed the track of its own place (at most 10 s). */
function phraseClips(before: InstrumentResponses, after: InstrumentResponses, rate: number): [Float32Array, Float32Array] {
  const phrase = synthesizePhraseCached();
  const n = Math.min(phrase.tracks[0]!.length, CLIP_MAX_SECONDS * rate);
  const trackAt = (pickupId: string) => phrase.tracks[phrase.pickupPositions.indexOf(pickupPositionOf(pickupId))]!.subarray(0, n);
  const one = (r: InstrumentResponses) =>
    renderPickupTracks(
      r.pickups.map((p) => trackAt(p.pickupId)),
      rate,
      r.pickups.map((p) => p.response),
    );
  return [one(before), one(after)];
}

/**
 * The before and after clips as 16-bit mono WAV bytes, through one common gain so the louder peaks
 * at CLIP_PEAK: a recording (its first CLIP_MAX_SECONDS, mono) through H(design)/H(chain), else the
 * built-in phrase with each pickup hearing the string at its own place. Pure computation: the pool runs it.
 */
export function renderClips(input: ClipRenderInput): [Uint8Array, Uint8Array] {
  let clips: [Float32Array, Float32Array];
  let rate: number;
  const afterR = instrumentResponses(input.after.netlist, input.after.knobs);
  const beforeR = instrumentResponses(input.before.netlist, input.before.knobs);
  if (input.recording) {
    const wav = readWav(input.recording.wav);
    rate = wav.sampleRate;
    const mono = monoHead(wav.channels, rate, CLIP_MAX_SECONDS);
    const h = harnessResponse(input.recording.chain.netlist, input.recording.chain.knobs);
    clips = [renderChannels([mono], rate, beforeR.total, h)[0]!, renderChannels([mono], rate, afterR.total, h)[0]!];
  } else {
    rate = CLIP_PHRASE_RATE;
    clips = phraseClips(beforeR, afterR, rate);
  }
  let peak = 0;
  for (const c of clips) for (let i = 0; i < c.length; i++) peak = Math.max(peak, Math.abs(c[i]!));
  const gain = peak > 0 ? Math.min(MAX_GAIN, CLIP_PEAK / peak) : 1;
  for (const c of clips) for (let i = 0; i < c.length; i++) c[i]! *= gain;
  return [writeWav([clips[0]], rate, 'pcm16'), writeWav([clips[1]], rate, 'pcm16')];
}

/** The clips as the report's attachment source: their paragraph and, when they can be made, the two WAV files (rendered in the job pool). */
export const soundClips: ReportAttachmentSource = async ({ db, job, uploadsDir, pool }) => {
  const clips = await reportClips(db, uploadsDir, job);
  // The recording's bytes are moved to the worker (the clips are rendered once per report).
  const render: ClipRenderer = (input) => {
    const wav = input.recording?.wav;
    const own = wav && wav.byteOffset === 0 && wav.byteLength === wav.buffer.byteLength;
    return pool.run('reportClips', input, own ? { transfer: [wav.buffer as ArrayBuffer] } : {});
  };
  return { attachments: await clips.attachments(render), lines: clips.text ? [clips.text] : [] };
};
