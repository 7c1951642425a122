// Choosers for values measured on the bench: a pickup's latest coil fit (R, L, C, Rp) or a pot's
// latest taper fit (total, law and mid-rotation). The lists are asked for only when a chooser is
// opened, since each part's fits are a separate request.
import { useId } from 'react';
import { formatValue } from '@shared/units/format';
import { Alert } from '@/components/ui/alert';
import { formatDate } from '@/lib/format';
import { MEASURED_LIMIT, useMeasuredPickups, useMeasuredPots, type MeasuredPickup, type MeasuredPot } from '../api/get-measured-parts';
import { LAW_LABEL } from './design-state';

const SELECT =
  'block w-full rounded-md border border-paper-edge bg-paper-bright px-3 py-2 text-base sm:text-sm focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent';

function Status({ pending, error, count, looked, none }: { pending: boolean; error: Error | null; count: number; looked: number; none: string }) {
  if (error) return <Alert>{error.message}</Alert>;
  if (pending) return <p className="text-xs text-ink-soft" role="status">Looking for measured parts…</p>;
  if (count === 0) return <p className="text-xs text-ink-soft">{none}</p>;
  if (looked >= MEASURED_LIMIT) return <p className="text-xs text-ink-soft">Among the {MEASURED_LIMIT} newest parts of this kind.</p>;
  return null;
}

export const pickupSummary = (p: MeasuredPickup) =>
  `${p.part.label} · ${formatValue(p.coil.R, 'Ω')} · ${formatValue(p.coil.L, 'H')} · ${formatValue(p.coil.C, 'F')}${p.coil.Rp ? ` · Rp ${formatValue(p.coil.Rp, 'Ω')}` : ''}`;

export const potSummary = (p: MeasuredPot) =>
  `${p.part.label} · ${formatValue(p.taper.total, 'Ω')} · ${p.taper.law === 'linear' ? LAW_LABEL.linear.toLowerCase() : `${LAW_LABEL[p.taper.law].toLowerCase()}, ${Number((p.taper.m * 100).toPrecision(3))} % at mid`}`;

export function MeasuredPickupPicker({ onPick }: { onPick: (p: MeasuredPickup) => void }) {
  const id = useId();
  const list = useMeasuredPickups(true);
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-medium">
        Measured pickup (latest coil fit)
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
        <option value="">{list.pending ? 'Loading…' : list.items.length ? 'Choose a pickup…' : 'None available'}</option>
        {list.items.map((p) => (
          <option key={p.part.id} value={p.part.id}>
            {pickupSummary(p)} (fit {formatDate(p.fit.createdAt)})
          </option>
        ))}
      </select>
      <Status {...list} count={list.items.length} none="No pickup has a coil fit yet. Upload an impedance sweep on the pickup's page first." />
    </div>
  );
}

export function MeasuredPotPicker({ which, onPick }: { which: 'volume' | 'tone'; onPick: (p: MeasuredPot) => void }) {
  const id = useId();
  const list = useMeasuredPots(true);
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-medium">
        Measured pot for the {which} (latest taper fit)
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
        <option value="">{list.pending ? 'Loading…' : list.items.length ? 'Choose a pot…' : 'None available'}</option>
        {list.items.map((p) => (
          <option key={p.part.id} value={p.part.id}>
            {potSummary(p)} (fit {formatDate(p.fit.createdAt)})
          </option>
        ))}
      </select>
      <Status {...list} count={list.items.length} none="No pot has a taper fit yet. Upload a rotation sweep on the pot's page first." />
    </div>
  );
}
