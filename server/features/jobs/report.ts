// The customer report: what was installed (with the measured values and verdicts) and, when the
// job has a harness design, what the wiring will do at a few knob settings.
import { eq } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { harnesses } from '@server/db/schema';
import { describeVerdict, partEvidence } from '@server/features/parts/evidence';
import { findPart } from '@server/features/parts/repository';
import { simulate, sweepKnobs } from '@shared/circuit/metrics';
import { getPreset, type HarnessValues } from '@shared/circuit/presets';
import { nominalQuantity } from '@shared/analysis/reading-verdict';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT } from '@shared/units/quantities';
import type { JobDetail } from './repository';

const fmtDb = (x: number) => `${x >= 0 ? '+' : ''}${x.toFixed(1)} dB`;

export function harnessSummary(db: DbLike, harnessId: number | null): { text: string; csv: string } | null {
  if (!harnessId) return null;
  const design = db.select().from(harnesses).where(eq(harnesses.id, harnessId)).get();
  const preset = design && getPreset(design.preset);
  if (!design || !preset) return null;
  const netlist = preset.build({ ...preset.defaults, ...(design.values as Partial<HarnessValues>) });
  const volume = [10, 8, 6, 4, 2];
  const grid = sweepKnobs(netlist, { volume, tone: [10] });
  const full = simulate(netlist, { volume: 10, tone: 10 });
  const lines = [
    `Wiring: ${design.name} (${preset.name}).`,
    `At full volume and tone the pickup's resonance sits at ${formatValue(full.metrics.peak.frequency, 'Hz')}, ${fmtDb(full.metrics.peakRiseDb)} above the bass.`,
    'As the volume comes down (tone at 10):',
    ...volume.map((v, i) => `  volume ${v}: level ${fmtDb(grid.volumeTaperDb[i]!)}, treble balance ${fmtDb(grid.trebleRetentionDb[i]!)} against full volume`),
  ];
  const csvRows = ['frequency_hz,' + volume.map((v) => `volume_${v}_db`).join(',')];
  grid.frequencies.forEach((f, k) => {
    csvRows.push([f.toPrecision(6), ...volume.map((_, vi) => grid.magnitudeDb[vi * grid.frequencies.length + k]!.toFixed(3))].join(','));
  });
  return { text: lines.join('\n'), csv: csvRows.join('\n') + '\n' };
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
  const status = ev.judged === 'flagged' ? `flagged: ${[...failed, ...flagWords].join(', ')}` : ev.judged === 'passed' ? 'passed' : 'not checked';
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
    ...(harness ? ['', harness.text, '', 'The predicted curves are attached as CSV (level in dB against frequency).'] : []),
    '',
    ...(harness ? ["Predictions come from a circuit model of the wiring design with the design's typical part values, not the measured parts above; your amplifier and cable change the exact figures."] : []),
  ].join('\n').trimEnd();
  return { text, csv: harness?.csv ?? null };
}
