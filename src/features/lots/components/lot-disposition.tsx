// The QA decision on a lot: accepted, rejected or sorted, always with a reason; watchers are
// e-mailed. A disposition is final; only an admin can reopen the lot, again with a reason.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { DISPOSITIONS, DispositionInputSchema, ReopenInputSchema } from '@shared/schemas/lots';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextAreaField } from '@/components/ui/field';
import { useCan, useUser } from '@/lib/auth';
import { applyServerError } from '@/lib/form';
import { formatDateTime } from '@/lib/format';
import { useDisposeLot, useReopenLot } from '../api/dispose-lot';
import type { Disposition, LotDetail } from '../api/types';
import { LOT_STATUS_LOOK, LotStatusBadge } from './lot-status-badge';

const WHAT: Record<Disposition, string> = {
  accepted: 'The lot goes into stock as it is.',
  rejected: 'The lot goes back to the supplier.',
  sorted: 'Kept after sorting into bins and sets; parts outside go back.',
};

function DispositionForm({ lot, onNotified }: { lot: LotDetail; onNotified: (n: number) => void }) {
  const dispose = useDisposeLot();
  const form = useForm<z.input<typeof DispositionInputSchema>, unknown, z.output<typeof DispositionInputSchema>>({
    resolver: zodResolver(DispositionInputSchema),
    defaultValues: { status: undefined as unknown as Disposition, reason: '' },
  });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit(async (input) => {
    try {
      const r = await dispose.mutateAsync({ id: lot.id, input });
      onNotified(r.notified);
    } catch (err) {
      applyServerError(err, form.setError, ['status', 'reason']);
    }
  });
  const noReadings = lot.count === 0;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Record the disposition">
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      {noReadings && <p className="text-sm text-ink-soft">Upload the lot’s readings before deciding on it.</p>}
      <fieldset aria-describedby={errors.status ? 'disp-status-error' : undefined}>
        <legend className="mb-1 text-sm font-medium">Decision</legend>
        <div className="grid gap-2 sm:grid-cols-3">
          {DISPOSITIONS.map((d) => (
            <label
              key={d}
              className="flex cursor-pointer gap-2 rounded-md border border-paper-edge bg-paper-bright p-2.5 text-sm has-[:checked]:border-accent has-[:checked]:bg-accent-tint"
            >
              <input type="radio" value={d} className="mt-0.5 size-4 accent-accent" disabled={noReadings} {...form.register('status')} />
              <span>
                <LotStatusBadge status={d} />
                <span className="mt-1 block text-xs text-ink-soft">{WHAT[d]}</span>
              </span>
            </label>
          ))}
        </div>
        {errors.status && (
          <p id="disp-status-error" className="mt-1 text-sm text-fail">
            Choose accepted, rejected or sorted.
          </p>
        )}
      </fieldset>
      <TextAreaField
        label="Reason"
        hint="Required. Sent to the watchers and kept with the lot."
        rows={2}
        disabled={noReadings}
        error={errors.reason?.message}
        {...form.register('reason')}
      />
      <Button type="submit" variant="primary" busy={dispose.isPending} busyText="Recording…" disabled={noReadings}>
        Record the disposition
      </Button>
    </form>
  );
}

function ReopenForm({ lot }: { lot: LotDetail }) {
  const reopen = useReopenLot();
  const [open, setOpen] = useState(false);
  const form = useForm<z.input<typeof ReopenInputSchema>, unknown, z.output<typeof ReopenInputSchema>>({
    resolver: zodResolver(ReopenInputSchema),
    defaultValues: { reason: '' },
  });
  const { errors } = form.formState;
  if (!open)
    return (
      <Button variant="danger" size="sm" onClick={() => setOpen(true)}>
        Reopen…
      </Button>
    );
  const onSubmit = form.handleSubmit(async (input) => {
    try {
      await reopen.mutateAsync({ id: lot.id, input });
    } catch (err) {
      applyServerError(err, form.setError, ['reason']);
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="mt-3 space-y-3 border-t border-paper-edge pt-3" aria-label="Reopen the lot">
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <TextAreaField label="Why reopen it?" rows={2} error={errors.reason?.message} {...form.register('reason')} />
      <div className="flex gap-2">
        <Button type="submit" variant="danger" busy={reopen.isPending} busyText="Reopening…">
          Reopen the lot
        </Button>
        <Button onClick={() => setOpen(false)}>Cancel</Button>
      </div>
    </form>
  );
}

export function LotDisposition({ lot }: { lot: LotDetail }) {
  const canDecide = useCan('qa');
  const isAdmin = useCan('admin');
  const user = useUser();
  // The form goes away once the lot is decided; the number of e-mails sent stays in view here.
  const [notified, setNotified] = useState<number | null>(null);
  if (lot.status === 'open') {
    return canDecide ? (
      <DispositionForm lot={lot} onNotified={setNotified} />
    ) : (
      <p className="text-sm text-ink-soft">Open: no disposition yet. A QA lead records it.</p>
    );
  }
  // The lot answer gives the member's id; the name is known when it is a watcher or oneself.
  const who = lot.disposedBy === user?.id ? `${user.name} (you)` : (lot.disposedByName ?? 'a member who has left');
  return (
    <div>
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <LotStatusBadge status={lot.status} /> by {who} on {formatDateTime(lot.disposedAt)}
      </p>
      <blockquote className="mt-2 border-l-4 border-paper-edge pl-3 text-sm whitespace-pre-wrap">{lot.dispositionReason}</blockquote>
      {notified !== null && (
        <div className="mt-3">
          <Alert tone="success">
            Recorded.{' '}
            {notified === 0
              ? 'The lot has no watchers, so no e-mail was sent.'
              : `${notified} watcher${notified === 1 ? '' : 's'} notified by e-mail.`}
          </Alert>
        </div>
      )}
      <p className="mt-2 text-xs text-ink-soft">
        {LOT_STATUS_LOOK[lot.status].label} is final: no new readings until an admin reopens the lot.
      </p>
      {isAdmin && (
        <div className="mt-3">
          <ReopenForm lot={lot} />
        </div>
      )}
    </div>
  );
}
