import type { HarnessAnalysis } from './use-harness-analysis';
import { formatDb, formatHz } from './harness-format';

export interface MetricRow {
  label: string;
  hint: string;
  value: number | null;
  kind: 'hz' | 'db';
  /** Words shown instead of the value ("no signal" when the volume is at 0). */
  text?: string;
  /** A difference of two such values is shown as a ratio (Hz) or a difference (dB). */
}

/** The figures of one design at the current knobs, in the order the tables show them. */
export function metricRows(a: HarnessAnalysis): MetricRow[] {
  const m = a.current.metrics;
  const silent = m.noSignal ? { text: 'no signal' } : {};
  const rows: MetricRow[] = [
    {
      label: 'Resonant peak',
      hint: m.peak.interior ? 'where the pickup and the load resonate' : 'no peak inside 20 Hz – 20 kHz; the highest point is at an end',
      value: m.peak.interior ? m.peak.frequency : null,
      kind: 'hz',
      ...silent,
    },
    { label: 'Peak height', hint: 'level at the peak', value: m.peak.levelDb, kind: 'db', ...silent },
    { label: 'Rise above the bass', hint: 'peak level minus the level at 20 Hz', value: m.peakRiseDb, kind: 'db', ...silent },
    { label: '−3 dB corner', hint: 'where the treble falls 3 dB below the level at 20 Hz', value: m.cornerHz, kind: 'hz', ...silent },
    { label: 'Level at 1 kHz', hint: 'loudness in the middle of the range', value: m.level1kDb, kind: 'db', ...silent },
    { label: 'Volume taper here', hint: 'level at 1 kHz against full volume, same tone', value: a.point.volumeTaperDb, kind: 'db' },
    {
      label: 'Treble retention here',
      hint: '(3 kHz − 200 Hz) against the same at full volume',
      value: a.point.trebleRetentionDb,
      kind: 'db',
      ...silent,
    },
  ];
  return rows;
}

export const formatMetric = (row: Pick<MetricRow, 'kind' | 'value' | 'text'>) =>
  row.text !== undefined
    ? row.text
    : row.kind === 'hz'
      ? row.value === null
        ? 'none in range'
        : formatHz(row.value)
      : formatDb(row.value);

export function MetricsTable({ analysis, caption }: { analysis: HarnessAnalysis; caption: string }) {
  const rows = metricRows(analysis);
  // Two short tables side by side on wider screens: the curve's own figures, then the sweep figures.
  const halves = [rows.slice(0, 4), rows.slice(4)];
  return (
    <div className="grid gap-x-8 sm:grid-cols-2">
      {halves.map((half, i) => (
        <table key={i} className="w-full self-start text-sm">
          <caption className="sr-only">{i === 0 ? caption : `${caption}, continued`}</caption>
          <tbody>
            {half.map((r) => (
              <tr key={r.label} className="border-b border-paper-edge/70 last:border-0">
                <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                  <span className="block font-medium text-ink">{r.label}</span>
                  <span className="block text-xs text-ink-soft">{r.hint}</span>
                </th>
                <td className="num whitespace-nowrap py-1.5 text-right align-top">{formatMetric(r)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ))}
    </div>
  );
}
