// The customer report: what was installed (with the measured values and verdicts) and, when the
// job has a harness design, what the wiring will do at a few knob settings.
import { conditionsHeader } from '@shared/csv/conditions';
import { eq } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { harnesses } from '@server/db/schema';
import { describeVerdict, partEvidence } from '@server/features/parts/evidence';
import { findPart } from '@server/features/parts/repository';
import { buildLayoutNetlist, getLayout, layoutKnobs, resolveLayoutConfig, toneKnobs, volumeKnobs } from '@shared/circuit/layouts';
import { simulateInstrument, sweepKnobs } from '@shared/circuit/metrics';
import { getPreset } from '@shared/circuit/presets';
import { solveChecked, UnsolvableHarness } from '@server/features/harness/solvable';
import { nominalQuantity } from '@shared/analysis/reading-verdict';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT } from '@shared/units/quantities';
import type { JobDetail } from './repository';

const fmtDb = (x: number) => `${x >= 0 ? '+' : ''}${x.toFixed(1)} dB`;

export function harnessSummary(db: DbLike, harnessId: number | null): { text: string; csv: string | null } | null {
  if (!harnessId) return null;
  const design = db.select().from(harnesses).where(eq(harnesses.id, harnessId)).get();
  const layout = design && getLayout(design.layout);
  if (!design || !layout) return null;
  const { config, problems } = resolveLayoutConfig(layout, { selector: design.selector, options: design.options, values: design.values });
  if (problems.length > 0)
    return {
      text: `Wiring: ${design.name} (${layout.name}). Its predicted response could not be computed: ${problems[0]!.message}`,
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
    // A design saved with values the engine cannot solve: the report says so instead of failing.
    if (err instanceof UnsolvableHarness)
      return {
        text: `Wiring: ${design.name} (${layout.name}). Its predicted response could not be computed with the values saved in the design.`,
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
    { key: 'computed', value: 'circuit model with the values saved in the design (not measured)' },
  ]);
  const csvRows = ['frequency_hz,' + volume.map((v) => `volume_${v}_db`).join(',')];
  grid.frequencies.forEach((f, k) => {
    csvRows.push([f.toPrecision(6), ...volume.map((_, vi) => grid.magnitudeDb[vi * grid.frequencies.length + k]!.toFixed(3))].join(','));
  });
  return { text: lines.join('\n'), csv: header + csvRows.join('\n') + '\n' };
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

/**
 * Where the prediction's part values come from, in words: a design may hold values taken from measured
 * parts when it was saved (its partRefs); the rest are typical values. Neither is necessarily a part
 * installed in this job.
 */
function predictionSource(db: DbLike, harnessId: number | null): string {
  const refs = harnessId
    ? (db.select({ partRefs: harnesses.partRefs }).from(harnesses).where(eq(harnesses.id, harnessId)).get()?.partRefs ?? {})
    : {};
  const measured = Object.entries(refs).map(([key, partId]) => {
    const part = findPart(db, partId);
    return `${key} from ${part ? part.label : `part ${partId}`}`;
  });
  const amp = 'your amplifier and cable change the exact figures.';
  if (measured.length === 0) {
    return `Predictions come from a circuit model of the wiring design with the design's typical part values, not the measured parts above; ${amp}`;
  }
  return `Predictions come from a circuit model of the wiring design with the values saved in it: ${measured.join(', ')} taken from measured parts when the design was saved, the rest typical values, not necessarily the parts installed above; ${amp}`;
}

export function reportText(db: DbLike, job: JobDetail, shopMessage?: string): { text: string; csv: string | null } {
  const partLines = job.parts.map((p) => partLine(db, p));
  const harness = harnessSummary(db, job.harnessId);
  const text = [
    `Hello ${job.customer},`,
    '',
    `here is the record of the work on your ${job.instrument} (job ${job.code}).`,
    ...(shopMessage ? ['', shopMessage] : []),
    '',
    'Parts installed:',
    ...(partLines.length ? partLines : ['  (none recorded)']),
    ...(harness
      ? ['', harness.text, ...(harness.csv ? ['', 'The predicted curves are attached as CSV (level in dB against frequency).'] : [])]
      : []),
    '',
    ...(harness ? [predictionSource(db, job.harnessId)] : []),
  ]
    .join('\n')
    .trimEnd();
  return { text, csv: harness?.csv ?? null };
}
