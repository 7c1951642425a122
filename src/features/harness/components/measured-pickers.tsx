// Choosers for values measured on the bench: a pickup's latest coil fit (R, L, C, Rp) or a pot's
// latest taper fit (total, law and mid-rotation). The lists are asked for only when a chooser is
// opened, since each part's fits are a separate request.
import { useId } from 'react';
import { TAPER_LAW_LABEL } from '@shared/taper/law';
import { formatValue } from '@shared/units/format';
import { Alert } from '@/components/ui/alert';
import { formatDate } from '@/lib/format';
import {
  MEASURED_LIMIT,
  useMeasuredCapacitors,
  useMeasuredPickups,
  useMeasuredPots,
  type MeasuredCapacitor,
  type MeasuredList,
  type MeasuredPickup,
  type MeasuredPot,
} from '../api/get-measured-parts';

const SELECT =
  'block w-full rounded-md border border-paper-edge bg-paper-bright px-3 py-2 text-base sm:text-sm focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent';

function Status({
  pending,
  error,
  count,
  looked,
  none,
}: {
  pending: boolean;
  error: Error | null;
  count: number;
  looked: number;
  none: string;
}) {
  if (error) return <Alert>{error.message}</Alert>;
  if (pending)
    return (
      <p className="text-xs text-ink-soft" role="status">
        Looking for measured parts…
      </p>
    );
  if (count === 0) return <p className="text-xs text-ink-soft">{none}</p>;
  if (looked >= MEASURED_LIMIT) return <p className="text-xs text-ink-soft">Among the {MEASURED_LIMIT} newest parts of this kind.</p>;
  return null;
}

export const pickupSummary = (p: MeasuredPickup) =>
  `${p.part.label} · ${formatValue(p.coil.R, 'Ω')} · ${formatValue(p.coil.L, 'H')} · ${formatValue(p.coil.C, 'F')}${p.coil.Rp ? ` · Rp ${formatValue(p.coil.Rp, 'Ω')}` : ''}`;

export const potSummary = (p: MeasuredPot) =>
  `${p.part.label} · ${formatValue(p.taper.total, 'Ω')} · ${p.taper.law === 'linear' ? TAPER_LAW_LABEL.linear.toLowerCase() : `${TAPER_LAW_LABEL[p.taper.law].toLowerCase()}, ${Number((p.taper.m * 100).toPrecision(3))} % at mid`}`;

/** One chooser of measured parts: the newest fit (or reading) of each, summarised in a line. */
function MeasuredPicker<T extends { part: { id: number } }>({
  label,
  list,
  summary,
  choose,
  none,
  onPick,
  when,
}: {
  label: string;
  list: MeasuredList<T>;
  summary: (item: T) => string;
  /** When the figure was measured or fitted, in words. */
  when: (item: T) => string;
  choose: string;
  none: string;
  onPick: (item: T) => void;
}) {
  const id = useId();
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-medium">
        {label}
      </label>
      <select
        id={id}
        className={SELECT}
        value=""
        disabled={list.items.length === 0}
        onChange={(e) => {
          const item = list.items.find((p) => String(p.part.id) === e.currentTarget.value);
          if (item) onPick(item);
        }}
      >
        <option value="">{list.pending ? 'Loading…' : list.items.length ? choose : 'None available'}</option>
        {list.items.map((p) => (
          <option key={p.part.id} value={p.part.id}>
            {summary(p)} ({when(p)})
          </option>
        ))}
      </select>
      <Status {...list} count={list.items.length} none={none} />
    </div>
  );
}

export function MeasuredPickupPicker({ onPick }: { onPick: (p: MeasuredPickup) => void }) {
  return (
    <MeasuredPicker
      label="Measured pickup (latest coil fit)"
      list={useMeasuredPickups(true)}
      summary={pickupSummary}
      when={(p) => `fit ${formatDate(p.fit.createdAt)}`}
      choose="Choose a pickup…"
      none="No pickup has a coil fit yet. Upload an impedance sweep on the pickup's page first."
      onPick={onPick}
    />
  );
}

export function MeasuredPotPicker({ which, onPick }: { which: 'volume' | 'tone'; onPick: (p: MeasuredPot) => void }) {
  return (
    <MeasuredPicker
      label={`Measured pot for the ${which} (latest taper fit)`}
      list={useMeasuredPots(true)}
      summary={potSummary}
      when={(p) => `fit ${formatDate(p.fit.createdAt)}`}
      choose="Choose a pot…"
      none="No pot has a taper fit yet. Upload a rotation sweep on the pot's page first."
      onPick={onPick}
    />
  );
}

export const capacitorSummary = (c: MeasuredCapacitor) =>
  `${c.part.label} · ${formatValue(c.reading.value, 'F', { digits: 4 })}${c.reading.frequency ? ` at ${formatValue(c.reading.frequency, 'Hz')}` : ''}`;

export function MeasuredCapacitorPicker({ label, onPick }: { label: string; onPick: (c: MeasuredCapacitor) => void }) {
  return (
    <MeasuredPicker
      label={`Measured capacitor for the ${label} (latest capacitance reading)`}
      list={useMeasuredCapacitors(true)}
      summary={capacitorSummary}
      when={(c) => `read ${formatDate(c.reading.takenAt)}`}
      choose="Choose a capacitor…"
      none="No capacitor has a capacitance reading yet. Record one at the Bench first."
      onPick={onPick}
    />
  );
}
