// The slots of the job's wiring design and the installed part in each: a tech chooses a part of the
// fitting kind (a pot for a pot's slot, a capacitor for a capacitor's…) or none, with the keyboard
// as with the mouse (one native select per slot). The report's predictions use the assigned parts'
// measured values; a slot left empty keeps the design's typical values.
import { Link } from 'react-router-dom';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { paths } from '@/config/paths';
import { useAssignSlot } from '../api/job-parts';
import type { JobDetail, JobSlot } from '../api/types';

const ACCEPTS_WORD: Record<JobSlot['accepts'], string> = {
  pot: 'a pot',
  capacitor: 'a capacitor',
  resistor: 'a resistor',
  pickup: 'a pickup',
};

export function JobSlots({ job, canWrite }: { job: JobDetail; canWrite: boolean }) {
  const assign = useAssignSlot();
  if (!job.harnessId)
    return <p className="text-sm text-ink-soft">Choose a harness design for the job first: its slots are listed here then.</p>;
  if (job.slots.length === 0) return <p className="text-sm text-ink-soft">The job's design has no slots for parts.</p>;
  const partOf = (id: number | null) => job.parts.find((p) => p.partId === id);
  const stray = job.parts.filter((p) => p.slot && !job.slots.some((s) => s.key === p.slot));
  const th = 'border-b border-paper-edge px-3 py-2 font-medium';
  return (
    <div>
      <p className="mb-3 text-sm text-ink-soft">
        The report's predictions use the measured values of the part in each slot (a pot's fitted resistance and law, a capacitor's or
        resistor's latest reading, a pickup's coil fit); an empty slot, or a value the part was not measured in, keeps the design's typical
        value, and the report says which is which.
      </p>
      {assign.isError && <Alert>{assign.error.message}</Alert>}
      <table className="table-list w-full border-collapse text-sm">
        <caption className="sr-only">Slots of the design {job.harnessName ?? ''} and their parts</caption>
        <thead className="bg-paper-deep text-left text-ink-soft">
          <tr>
            <th scope="col" className={th}>
              Slot
            </th>
            <th scope="col" className={th}>
              Takes
            </th>
            <th scope="col" className={th}>
              Part
            </th>
          </tr>
        </thead>
        <tbody>
          {job.slots.map((slot) => {
            const current = partOf(slot.partId);
            // Installed parts of the slot's kind that are in no other slot, and the one in this slot.
            const choices = job.parts.filter((p) => p.kind === slot.accepts && (p.slot === null || p.slot === slot.key));
            const selectId = `slot-${slot.key}`;
            return (
              <tr key={slot.key} className="border-b border-paper-edge/70 last:border-b-0">
                <th scope="row" data-label="Slot" className="px-3 py-2 text-left font-medium">
                  {slot.name} <span className="num text-xs font-normal text-ink-soft">{slot.key}</span>
                </th>
                <td data-label="Takes" className="px-3 py-2">
                  {ACCEPTS_WORD[slot.accepts]}
                </td>
                <td data-label="Part" className="px-3 py-2">
                  {canWrite ? (
                    <div className="flex flex-wrap items-center gap-2">
                      <label htmlFor={selectId} className="sr-only">
                        Part in the slot {slot.name}
                      </label>
                      <select
                        id={selectId}
                        className="max-w-full rounded-md border border-paper-edge bg-paper-bright px-2 py-1.5 text-sm"
                        value={slot.partId ?? ''}
                        disabled={assign.isPending}
                        onChange={(e) => {
                          const partId = e.target.value === '' ? null : Number(e.target.value);
                          if (partId === null && current) assign.mutate({ id: job.id, partId: current.partId, slot: null });
                          else if (partId !== null) assign.mutate({ id: job.id, partId, slot: slot.key });
                        }}
                      >
                        <option value="">None: typical values</option>
                        {choices.map((p) => (
                          <option key={p.partId} value={p.partId}>
                            {p.label} ({p.position})
                          </option>
                        ))}
                      </select>
                      {current && (
                        <Button
                          size="sm"
                          disabled={assign.isPending}
                          aria-label={`Clear the slot ${slot.name}`}
                          onClick={() => assign.mutate({ id: job.id, partId: current.partId, slot: null })}
                        >
                          Clear
                        </Button>
                      )}
                      {choices.length === 0 && (
                        <span className="text-xs text-ink-soft">No installed {slot.accepts} is free for this slot.</span>
                      )}
                    </div>
                  ) : current ? (
                    <Link to={paths.app.part.getHref(current.partId)} className="num text-accent underline-offset-2 hover:underline">
                      {current.label}
                    </Link>
                  ) : (
                    <span className="text-ink-soft">None: typical values</span>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {stray.length > 0 && (
        <Alert title="Parts in slots this design does not have">
          {stray.map((p) => `${p.label} (${p.slot})`).join(', ')}: their values are not in the predictions.
        </Alert>
      )}
    </div>
  );
}
