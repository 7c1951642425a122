// The customer report: what was installed (with the measured values and verdicts) and, when the
// job has a wiring design, what the wiring will do at a few knob settings, computed with the
// measured values of the installed parts assigned to the design's slots (typical values elsewhere,
// said so line by line). One function, composeReport, builds the whole message — subject, text and
// attachments — for both the preview on the job page and the e-mail, so the two cannot differ.
import { conditionsHeader } from '@shared/csv/conditions';
import type { DbLike } from '@server/db/client';
import { describeVerdict, partEvidence } from '@server/features/parts/evidence';
import { findPart } from '@server/features/parts/repository';
import { buildLayoutNetlist, layoutKnobs, resolveLayoutConfig, toneKnobs, volumeKnobs, type LayoutValue } from '@shared/circuit/layouts';
import { simulateInstrument, sweepKnobs } from '@shared/circuit/metrics';
import { getPreset } from '@shared/circuit/presets';
import type { DesignSlot } from '@shared/circuit/slots';
import { solveChecked, UnsolvableHarness } from '@server/features/harness/solvable';
import { nominalQuantity } from '@shared/analysis/reading-verdict';
import { lawMid, TAPER_LAW_LABEL, type TaperLaw } from '@shared/taper/law';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT } from '@shared/units/quantities';
import type { JobDetail } from './repository';
import type { JobPool } from '@server/pool';
import { soundClips } from './clips';
import { designOf, slotValues, type SlotQuantity } from './slots';

const fmtDb = (x: number) => `${x >= 0 ? '+' : ''}${x.toFixed(1)} dB`;

const QUANTITY_WORD: Record<SlotQuantity, string> = {
  resistance: 'resistance',
  law: 'law',
  capacitance: 'capacitance',
  inductance: 'inductance',
  lossResistance: 'loss resistance',
};
const PICKUP_WORD: Partial<Record<SlotQuantity, string>> = { resistance: 'DC resistance', capacitance: 'self-capacitance' };
const UNIT: Record<SlotQuantity, string> = { resistance: 'Ω', law: '', capacitance: 'F', inductance: 'H', lossResistance: 'Ω' };

/** "audio, 14.2 % at mid-rotation", "linear". */
export function lawWords(law: TaperLaw): string {
  const name = TAPER_LAW_LABEL[law.kind].toLowerCase();
  return law.kind === 'linear' ? name : `${name}, ${(lawMid(law) * 100).toFixed(1)} % at mid-rotation`;
}

function valueWords(quantity: SlotQuantity, value: LayoutValue | undefined): string {
  if (value === undefined) return 'none';
  return typeof value === 'number' ? formatValue(value, UNIT[quantity]) : lawWords(value);
}

/** The prediction of the job's design with the assigned parts' measured values. */
export interface Prediction {
  /** The wiring paragraph: design, options, knobs, resonance, the volume table. */
  text: string;
  /** One line per slot: which values are measured (with the part's label) and which are typical. */
  valueLines: string[];
  /** Layout value keys replaced by measured values, with the part label. */
  measured: { key: string; label: string; value: LayoutValue }[];
  /** Values of the design taken from measured parts when it was saved, still in use (its partRefs). */
  designRefs: number;
  /** The predicted curves with their conditions, or null when the design could not be computed. */
  csv: string | null;
}

/**
 * The design's values with every assigned part's measured values put in, and the words for each
 * slot. A value a part was not measured in keeps the design's value ("not measured, typical value
 * used"); a slot without a part keeps the design's values ("typical"), or names the part the design
 * took it from when it was saved (its partRefs).
 */
function valuesForJob(db: DbLike, job: JobDetail, design: NonNullable<ReturnType<typeof designOf>>) {
  const { layout, slots } = design;
  const saved = resolveLayoutConfig(layout, {
    selector: design.design.selector,
    options: design.design.options,
    values: design.design.values,
  });
  const designValues = saved.config.values;
  const refs = design.design.partRefs ?? {};
  const usedRefs = new Set<string>();
  const typicalWords = (slot: DesignSlot, q: SlotQuantity) => {
    const key = slot.values[q]!;
    const v = valueWords(q, designValues[key]);
    const ref = refs[key];
    if (ref === undefined) return v;
    usedRefs.add(key);
    const part = findPart(db, ref);
    return `${v} (the design's value, taken from ${part ? part.label : `part ${ref}`} when the design was saved)`;
  };
  const word = (slot: DesignSlot, q: SlotQuantity) => (slot.accepts === 'pickup' ? (PICKUP_WORD[q] ?? QUANTITY_WORD[q]) : QUANTITY_WORD[q]);
  const values: Record<string, unknown> = { ...(design.design.values as Record<string, unknown>) };
  const measured: Prediction['measured'] = [];
  const lines: string[] = [];
  for (const slot of slots) {
    const installed = job.parts.find((p) => p.slot === slot.key);
    const part = installed && findPart(db, installed.partId);
    const quantities = (Object.keys(slot.values) as SlotQuantity[]).filter((q) => q !== 'lossResistance');
    if (!part) {
      lines.push(
        `  ${slot.name}: no part assigned, typical values used: ${quantities.map((q) => `${word(slot, q)} ${typicalWords(slot, q)}`).join(', ')}.`,
      );
      continue;
    }
    const got = slotValues(db, part, slot);
    for (const m of got.measured) {
      values[m.key] = m.value;
      measured.push({ key: m.key, label: part.label, value: m.value });
    }
    const bySource = new Map<string, string[]>();
    for (const m of got.measured)
      bySource.set(m.source, [...(bySource.get(m.source) ?? []), `${word(slot, m.quantity)} ${valueWords(m.quantity, m.value)}`]);
    const parts = [
      ...[...bySource].map(([source, words]) => `measured ${words.join(', ')} (${source})`),
      ...got.notMeasured.map((q) => `${word(slot, q)} not measured, typical value used: ${typicalWords(slot, q)}`),
    ];
    lines.push(`  ${slot.name}: ${part.label}: ${parts.join('; ')}.`);
  }
  for (const p of job.parts) {
    if (p.slot && !slots.some((s) => s.key === p.slot))
      lines.push(`  ${p.label} is assigned to "${p.slot}", a slot this design does not use: its values are not in the predictions.`);
  }
  return { values, measured, lines, designRefs: usedRefs.size };
}

/** The predicted behaviour of the job's design, with the assigned parts' measured values; null without a design. */
export function predictJob(db: DbLike, job: JobDetail): Prediction | null {
  const found = designOf(db, job.harnessId);
  if (!found) return null;
  const { design, layout } = found;
  const { values, measured, lines: valueLines, designRefs } = valuesForJob(db, job, found);
  const { config, problems } = resolveLayoutConfig(layout, { selector: design.selector, options: design.options, values });
  if (problems.length > 0)
    return {
      text: `Wiring: ${design.name} (${layout.name}). Its predicted response could not be computed: ${problems[0]!.message} (${problems[0]!.path})`,
      valueLines,
      measured,
      designRefs,
      csv: null,
    };
  const netlist = buildLayoutNetlist(layout, config);
  const knobs = layoutKnobs(layout, design.knobs ?? {});
  const volumeKnob = volumeKnobs(layout)[0]!;
  const volume = [10, 8, 6, 4, 2];
  const volumeName = layout.knobs.find((k) => k.id === volumeKnob)!.name.toLowerCase();
  const preset = design.preset ? getPreset(design.preset) : undefined;
  let grid: ReturnType<typeof sweepKnobs>;
  let now: ReturnType<typeof simulateInstrument>;
  try {
    grid = solveChecked(
      () =>
        sweepKnobs(netlist, { volume, tone: [knobs[toneKnobs(layout)[0]!]!] }, undefined, {
          volumeKnob,
          toneKnob: toneKnobs(layout)[0]!,
          knobs,
        }),
      (g) => [g.level1kDb, g.volumeTaperDb, g.trebleRetentionDb],
    );
    now = solveChecked(
      () => simulateInstrument(netlist, knobs),
      (r) => [r.magnitudeDb],
    );
  } catch (err) {
    // Values the engine cannot solve: the report says so instead of failing.
    if (err instanceof UnsolvableHarness)
      return {
        text: `Wiring: ${design.name} (${layout.name}). Its predicted response could not be computed with these values.`,
        valueLines,
        measured,
        designRefs,
        csv: null,
      };
    throw err;
  }
  const choice = (id: string) => layout.options.find((o) => o.id === id)!.choices.find((c) => c.id === config.options[id])!.name;
  const loadValue =
    config.options.load === 'buffer'
      ? `${formatValue(config.values.bufferR as number, 'Ω')}`
      : config.options.load === 'low-impedance-pedal'
        ? `${formatValue(config.values.pedalR as number, 'Ω')}`
        : `${formatValue(config.values.ampR as number, 'Ω')}`;
  const lines = [
    `Wiring: ${design.name} (${layout.name}${preset ? `, from the preset ${preset.name}` : ''}), selector at ${layout.selector.positions[config.selector]!.name}.`,
    `Options: ${layout.options
      .filter((o) => o.id !== 'load')
      .map((o) => `${o.name.toLowerCase()}: ${choice(o.id).toLowerCase()}`)
      .join('; ')}.`,
    `Plays into: ${choice('load').toLowerCase()} (${loadValue}). Knobs: ${layout.knobs.map((k) => `${k.name.toLowerCase()} ${knobs[k.id]}`).join(', ')}.`,
    now.metrics
      ? `At these knobs the resonance sits at ${formatValue(now.metrics.peak.frequency, 'Hz')}, ${fmtDb(now.metrics.peakRiseDb)} above the bass.`
      : `At these knobs: ${now.note}.`,
    `As the ${volumeName} comes down:`,
    ...volume.map(
      (v, i) =>
        `  ${volumeName} ${v}: level ${fmtDb(grid.volumeTaperDb[i]!)}, treble balance ${fmtDb(grid.trebleRetentionDb[i]!)} against full volume`,
    ),
    'Predicted with every pickup as an equal signal source; a real string drives each pickup differently.',
  ];
  const header = conditionsHeader([
    { key: 'design', value: `${design.name} (${layout.name})` },
    { key: 'selector', value: layout.selector.positions[config.selector]!.name },
    ...layout.options.filter((o) => o.id !== 'load').map((o) => ({ key: o.name.toLowerCase(), value: choice(o.id).toLowerCase() })),
    { key: 'load', value: `${choice('load').toLowerCase()} (${loadValue})` },
    { key: 'knobs', value: layout.knobs.map((k) => `${k.name.toLowerCase()} ${knobs[k.id]}`).join(', ') },
    { key: 'curves', value: `${volumeName} at ${volume.join(', ')}, other knobs as above` },
    {
      key: 'computed',
      value: measured.length
        ? 'circuit model with the measured values of the parts assigned to the design, the rest typical values (not measured)'
        : 'circuit model with the typical values saved in the design (not measured)',
    },
    {
      key: 'measured values',
      value: measured.length
        ? measured
            .map((m) => `${m.key} ${valueWords(m.key.endsWith('Law') ? 'law' : unitQuantity(m.key), m.value)} (${m.label})`)
            .join('; ')
        : 'none',
    },
  ]);
  const csvRows = ['frequency_hz,' + volume.map((v) => `volume_${v}_db`).join(',')];
  grid.frequencies.forEach((f, k) => {
    csvRows.push([f.toPrecision(6), ...volume.map((_, vi) => grid.magnitudeDb[vi * grid.frequencies.length + k]!.toFixed(3))].join(','));
  });
  return { text: lines.join('\n'), valueLines, measured, designRefs, csv: header + csvRows.join('\n') + '\n' };
}

/** The quantity of a layout value key by its name (…R and …Rp resistance, …C capacitance, …L inductance). */
function unitQuantity(key: string): SlotQuantity {
  const last = key.split('.').pop()!;
  if (/Rp$/.test(last)) return 'lossResistance';
  if (/R$/.test(last)) return 'resistance';
  if (/L$/.test(last)) return 'inductance';
  return 'capacitance';
}

/** One installed part's line: its status as the evidence has it, the evidence, any override. */
export function partLine(db: DbLike, p: JobDetail['parts'][number]): string {
  const part = findPart(db, p.partId);
  const q = nominalQuantity(p.kind);
  const nominal = p.nominal != null ? ` ${formatValue(p.nominal, QUANTITY_UNIT[q])}` : '';
  const head = `  ${p.position}: ${p.kind} ${p.label}${nominal}`;
  if (!part) return `${head}: not found`;
  const ev = partEvidence(db, part);
  const flagWords = ev.fits.flatMap((f) => f.flags.map((fl) => fl.code.replace(/^m-/, 'mid-rotation-').replace(/-/g, ' ')));
  const failed = ev.verdicts.filter((v) => v.verdict === 'fail' || v.verdict === 'marginal').map((v) => `${v.quantity} ${v.verdict}`);
  const status =
    ev.judged === 'flagged' ? `flagged: ${[...failed, ...flagWords].join(', ')}` : ev.judged === 'passed' ? 'passed' : 'not checked';
  const evidence = [
    ...ev.verdicts.map((v) => `latest ${describeVerdict(v)}`),
    ...ev.fits.map((f) => {
      const fitted = f.law ? ` law ${f.law}${f.m != null ? `, mid-rotation ${(f.m * 100).toFixed(1)} %` : ''}` : '';
      return `${f.kind} fit${fitted}: ${f.flags.length ? f.flags.map((fl) => fl.message).join(' ') : 'no flags'}`;
    }),
  ];
  const lines = [`${head}: ${status}.`, `      evidence: ${evidence.length ? evidence.join('; ') : 'not measured'}`];
  if (p.overrideReason) lines.push(`      installed despite its status; reason given: ${p.overrideReason}`);
  return lines.join('\n');
}

/** Where the prediction's values come from, in one sentence. */
function predictionSource(prediction: Prediction): string {
  const amp = 'your amplifier and cable change the exact figures.';
  if (prediction.measured.length === 0 && prediction.designRefs > 0)
    return `Predictions come from a circuit model of the wiring design with the values saved in it (some taken from measured parts when the design was saved, as listed above, the rest typical values), not measurements of the parts assigned in this job; ${amp}`;
  if (prediction.measured.length === 0)
    return `Predictions come from a circuit model of the wiring design with typical part values, not measured ones (no installed part with a measurement is assigned to the design); ${amp}`;
  const labels = [...new Set(prediction.measured.map((m) => m.label))];
  return `Predictions come from a circuit model of the wiring design with the measured values of ${labels.join(', ')} (as listed above) and typical values for the rest; ${amp}`;
}

export interface ReportAttachment {
  filename: string;
  contentType: string;
  content: string | Buffer;
}

/** Everything an attachment source may use. */
export interface ReportInput {
  db: DbLike;
  job: JobDetail;
  prediction: Prediction | null;
  /** Where the job's stored files (its recording) are. */
  uploadsDir: string;
  /** The job pool, for attachments that take heavy computation (the sound clips). */
  pool: JobPool;
}

/** Adds attachments to the report, with the lines the text says about them. */
export type ReportAttachmentSource = (
  input: ReportInput,
) => { attachments: ReportAttachment[]; lines: string[] } | Promise<{ attachments: ReportAttachment[]; lines: string[] }>;

/** The predicted curves as CSV, when the design could be computed. */
const predictedCurves: ReportAttachmentSource = ({ job, prediction }) =>
  prediction?.csv
    ? {
        attachments: [{ filename: `${job.code}-predicted-curves.csv`, contentType: 'text/csv', content: prediction.csv }],
        lines: ['The predicted curves are attached as CSV (level in dB against frequency).'],
      }
    : { attachments: [], lines: [] };

/**
 * The report's attachments, built here and only here, in this order. A module that adds an
 * attachment (sound clips, photos) adds its source to this list; the preview and the e-mail both
 * read it through composeReport.
 */
export const REPORT_ATTACHMENT_SOURCES: ReportAttachmentSource[] = [predictedCurves, soundClips];

export interface ReportMessage {
  /** The recipient the e-mail goes to (the given address, else the job's customer's), or null. */
  to: string | null;
  subject: string;
  text: string;
  attachments: ReportAttachment[];
}

/** The whole customer e-mail: the preview on the job page and the message sent are both this. */
export async function composeReport(
  db: DbLike,
  job: JobDetail,
  opts: { to?: string; message?: string; uploadsDir: string; pool: JobPool },
): Promise<ReportMessage> {
  const partLines = job.parts.map((p) => partLine(db, p));
  const prediction = predictJob(db, job);
  const extras = [];
  for (const source of REPORT_ATTACHMENT_SOURCES)
    extras.push(await source({ db, job, prediction, uploadsDir: opts.uploadsDir, pool: opts.pool }));
  const attachmentLines = extras.flatMap((e) => e.lines);
  const text = [
    `Hello ${job.customer},`,
    '',
    `here is the record of the work on your ${job.instrument} (job ${job.code}).`,
    ...(opts.message ? ['', opts.message] : []),
    '',
    'Parts installed:',
    ...(partLines.length ? partLines : ['  (none recorded)']),
    ...(prediction
      ? [
          '',
          prediction.text,
          '',
          "Values in these predictions (measured: from the installed parts named; typical: the design's values, not measured):",
          ...(prediction.valueLines.length ? prediction.valueLines : ['  (the design has no slots for parts)']),
        ]
      : []),
    ...(attachmentLines.length ? ['', ...attachmentLines] : []),
    '',
    ...(prediction ? [predictionSource(prediction)] : []),
  ]
    .join('\n')
    .trimEnd();
  return {
    to: opts.to ?? job.customerEmail ?? null,
    subject: `Your ${job.instrument}: work record ${job.code}`,
    text,
    attachments: extras.flatMap((e) => e.attachments),
  };
}
