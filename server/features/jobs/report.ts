// The customer report: what was installed (with the measured values and verdicts) and, when the
// job has a harness design, what the wiring will do at a few knob settings.
import { desc, eq } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { harnesses, readings } from '@server/db/schema';
import { simulate, sweepKnobs } from '@shared/circuit/metrics';
import { solveChecked, UnsolvableHarness } from '@server/features/harness/solvable';
import { getPreset, type HarnessValues } from '@shared/circuit/presets';
import { nominalQuantity } from '@shared/analysis/reading-verdict';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT } from '@shared/units/quantities';
import type { JobDetail } from './repository';

const fmtDb = (x: number) => `${x >= 0 ? '+' : ''}${x.toFixed(1)} dB`;

export function harnessSummary(db: DbLike, harnessId: number | null): { text: string; csv: string | null } | null {
  if (!harnessId) return null;
  const design = db.select().from(harnesses).where(eq(harnesses.id, harnessId)).get();
  const preset = design && getPreset(design.preset);
  if (!design || !preset) return null;
  const netlist = preset.build({ ...preset.defaults, ...(design.values as Partial<HarnessValues>) });
  const volume = [10, 8, 6, 4, 2];
  let grid: ReturnType<typeof sweepKnobs>;
  let full: ReturnType<typeof simulate>;
  try {
    grid = solveChecked(() => sweepKnobs(netlist, { volume, tone: [10] }), (g) => [g.magnitudeDb, g.volumeTaperDb, g.trebleRetentionDb]);
    full = solveChecked(() => simulate(netlist, { volume: 10, tone: 10 }), (r) => [r.magnitudeDb]);
  } catch (err) {
    // A design saved with values the engine cannot solve: the report says so instead of failing.
    if (err instanceof UnsolvableHarness) return { text: `Wiring: ${design.name} (${preset.name}). Its predicted response could not be computed with the values saved in the design.`, csv: null };
    throw err;
  }
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

export function reportText(db: DbLike, job: JobDetail, shopMessage?: string): { text: string; csv: string | null } {
  const partLines = job.parts.map((p) => {
    const q = nominalQuantity(p.kind);
    const last = db.select().from(readings).where(eq(readings.partId, p.partId)).orderBy(desc(readings.id)).all().find((r) => r.quantity === q);
    const measured = last ? `measured ${formatValue(last.value, QUANTITY_UNIT[q])}${last.verdict ? ` (${last.verdict})` : ''}` : 'not measured';
    const nominal = p.nominal != null ? `${formatValue(p.nominal, QUANTITY_UNIT[q])}` : '';
    return `  ${p.position}: ${p.kind} ${p.label} ${nominal}, ${measured}`;
  });
  const harness = harnessSummary(db, job.harnessId);
  const text = [
    `Hello ${job.customer},`,
    '',
    `here is the record of the work on your ${job.instrument} (job ${job.code}).`,
    ...(shopMessage ? ['', shopMessage] : []),
    '',
    'Parts installed:',
    ...(partLines.length ? partLines : ['  (none recorded)']),
    ...(harness ? ['', harness.text, ...(harness.csv ? ['', 'The predicted curves are attached as CSV (level in dB against frequency).'] : [])] : []),
    '',
    'Predictions come from a circuit model with the measured parts; your amplifier and cable change the exact figures.',
  ].join('\n');
  return { text, csv: harness?.csv ?? null };
}
