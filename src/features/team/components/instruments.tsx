// Instruments: meters with their accuracy per quantity, ±(% of reading + counts × resolution), and
// their calibration due date. Readings taken with an overdue instrument are marked.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import {
  INSTRUMENT_KINDS,
  InstrumentInputSchema,
  READING_QUANTITIES,
  type InstrumentInput,
  type ReadingQuantity,
} from '@shared/schemas/bench';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT } from '@shared/units/quantities';
import { useInstruments, type Instrument } from '@/data/instruments';
import { OverdueMark } from '@/components/readings/overdue-mark';
import { QUANTITY_NAME, QUANTITY_SHORT } from '@/components/readings/words';
import { Alert, Loading } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { useCan } from '@/lib/auth';
import { applyServerError } from '@/lib/form';
import { useSaveInstrument } from '../api/save-instrument';
import { asText, engineering, plainNumber } from './field-text';

const RESOLUTION_EXAMPLE: Record<ReadingQuantity, string> = {
  resistance: 'e.g. 0.1, 100 (Ω)',
  capacitance: 'e.g. 1p, 0.1n (F)',
  inductance: 'e.g. 1m, 10u (H)',
  dissipation: 'e.g. 0.0001',
  esr: 'e.g. 1m, 0.01 (Ω)',
  q: 'e.g. 0.1',
};

const KIND_LABEL: Record<(typeof INSTRUMENT_KINDS)[number], string> = {
  multimeter: 'Multimeter',
  'lcr-meter': 'LCR meter',
  analyser: 'Impedance analyser',
  other: 'Other',
};

const Acc = z.object({ pct: z.string(), counts: z.string(), resolution: z.string() });
const Fields = z.object({
  name: z.string(),
  kind: z.enum(INSTRUMENT_KINDS),
  serial: z.string(),
  displayCounts: z.string(),
  calibrationDue: z.string(),
  notes: z.string(),
  accuracy: z.object(Object.fromEntries(READING_QUANTITIES.map((q) => [q, Acc])) as Record<ReadingQuantity, typeof Acc>),
});
type Values = z.input<typeof Fields>;

const Schema = Fields.transform((v, ctx): InstrumentInput => {
  let failed = false;
  const accuracy: InstrumentInput['accuracy'] = {};
  for (const q of READING_QUANTITIES) {
    const row = v.accuracy[q];
    if (!row.pct.trim() && !row.counts.trim() && !row.resolution.trim()) continue;
    const pct = plainNumber(row.pct);
    const counts = plainNumber(row.counts);
    const resolution = engineering(row.resolution, q);
    const fail = (field: string, message: string) => {
      failed = true;
      ctx.addIssue({ code: 'custom', path: ['accuracy', q, field], message });
    };
    if (!pct.ok) fail('pct', pct.error);
    if (!counts.ok) fail('counts', counts.error);
    if (!resolution.ok) fail('resolution', resolution.error);
    if (pct.ok && counts.ok && resolution.ok) {
      if ((counts.value ?? 0) > 0 && resolution.value === undefined) fail('resolution', 'Give the value of one count.');
      accuracy[q] = { pctOfReading: pct.value ?? 0, counts: counts.value ?? 0, resolution: resolution.value ?? 0 };
    }
  }
  const counts = v.displayCounts.trim() === '' ? null : Number(v.displayCounts.trim());
  const checked = InstrumentInputSchema.safeParse({
    name: v.name,
    kind: v.kind,
    serial: v.serial.trim() || null,
    displayCounts: counts,
    calibrationDue: v.calibrationDue || null,
    notes: v.notes.trim() || null,
    accuracy,
  });
  if (!checked.success) {
    for (const issue of checked.error.issues) {
      const path = issue.path.map(String);
      const target =
        path[0] === 'accuracy'
          ? ['accuracy', path[1] ?? 'resistance', path[2] === 'counts' ? 'counts' : path[2] === 'resolution' ? 'resolution' : 'pct']
          : [path[0] ?? 'name'];
      ctx.addIssue({ code: 'custom', path: target, message: issue.message });
    }
    return z.NEVER;
  }
  if (failed) return z.NEVER;
  return checked.data;
});

const toValues = (i?: Instrument): Values => ({
  name: i?.name ?? '',
  kind: i?.kind ?? 'multimeter',
  serial: i?.serial ?? '',
  displayCounts: i?.displayCounts != null ? String(i.displayCounts) : '',
  calibrationDue: i?.calibrationDue ?? '',
  notes: i?.notes ?? '',
  accuracy: Object.fromEntries(
    READING_QUANTITIES.map((q) => {
      const a = i?.accuracy[q];
      return [q, { pct: a ? String(a.pctOfReading) : '', counts: a ? String(a.counts) : '', resolution: a ? asText(a.resolution, q) : '' }];
    }),
  ) as Values['accuracy'],
});

function InstrumentForm({ instrument, onDone }: { instrument?: Instrument; onDone: () => void }) {
  const save = useSaveInstrument();
  const form = useForm<Values, unknown, InstrumentInput>({ resolver: zodResolver(Schema), defaultValues: toValues(instrument) });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit(async (input) => {
    try {
      await save.mutateAsync({ id: instrument?.id, input });
      onDone();
    } catch (err) {
      applyServerError(err, form.setError, ['name', 'kind', 'serial', 'displayCounts', 'calibrationDue', 'notes']);
    }
  });
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label={instrument ? `Edit ${instrument.name}` : 'New instrument'}
      className="space-y-4 rounded-md border border-paper-edge bg-paper p-3 sm:p-4"
    >
      <h3 className="text-sm font-semibold">{instrument ? `Edit “${instrument.name}”` : 'New instrument'}</h3>
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <TextField label="Name" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
        <SelectField label="Kind" error={errors.kind?.message} {...form.register('kind')}>
          {INSTRUMENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {KIND_LABEL[k]}
            </option>
          ))}
        </SelectField>
        <TextField label="Serial" autoComplete="off" error={errors.serial?.message} {...form.register('serial')} />
        <TextField label="Calibration due" type="date" error={errors.calibrationDue?.message} {...form.register('calibrationDue')} />
        <TextField
          label="Display counts"
          inputMode="numeric"
          autoComplete="off"
          hint="e.g. 6000: one count is then the range ÷ counts, range by range; blank uses the resolution below"
          error={errors.displayCounts?.message}
          {...form.register('displayCounts')}
        />
      </div>
      <fieldset>
        <legend className="mb-1 text-xs font-medium uppercase tracking-wide text-ink-soft">
          Accuracy: ±(% of reading + counts × resolution); leave a row blank when the meter does not measure it
        </legend>
        <div className="overflow-x-auto">
          <table className="w-full min-w-[560px] border-collapse text-sm">
            <thead>
              <tr className="text-left text-xs text-ink-soft">
                <th scope="col" className="py-1 pr-3 font-medium">
                  Quantity
                </th>
                <th scope="col" className="py-1 pr-3 font-medium">
                  % of reading
                </th>
                <th scope="col" className="py-1 pr-3 font-medium">
                  Counts
                </th>
                <th scope="col" className="py-1 font-medium">
                  Resolution (one count)
                </th>
              </tr>
            </thead>
            <tbody>
              {READING_QUANTITIES.map((q) => {
                const e = errors.accuracy?.[q];
                const unit = QUANTITY_UNIT[q];
                return (
                  <tr key={q} className="align-top">
                    <th scope="row" className="py-1 pr-3 pt-3 text-left font-normal">
                      {QUANTITY_NAME[q]}
                    </th>
                    <td className="py-1 pr-3">
                      <TextField
                        label={<span className="sr-only">{QUANTITY_NAME[q]}: % of reading</span>}
                        inputMode="decimal"
                        inputClassName="num"
                        autoComplete="off"
                        error={e?.pct?.message}
                        {...form.register(`accuracy.${q}.pct`)}
                      />
                    </td>
                    <td className="py-1 pr-3">
                      <TextField
                        label={<span className="sr-only">{QUANTITY_NAME[q]}: counts</span>}
                        inputMode="numeric"
                        inputClassName="num"
                        autoComplete="off"
                        error={e?.counts?.message}
                        {...form.register(`accuracy.${q}.counts`)}
                      />
                    </td>
                    <td className="py-1">
                      <TextField
                        label={
                          <span className="sr-only">
                            {QUANTITY_NAME[q]}: resolution{unit ? ` in ${unit}` : ''}
                          </span>
                        }
                        inputClassName="num"
                        autoComplete="off"
                        placeholder={RESOLUTION_EXAMPLE[q]}
                        spellCheck={false}
                        error={e?.resolution?.message}
                        {...form.register(`accuracy.${q}.resolution`)}
                      />
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      </fieldset>
      <TextAreaField label="Notes" rows={2} error={errors.notes?.message} {...form.register('notes')} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" busy={save.isPending} busyText="Saving…">
          {instrument ? 'Save changes' : 'Add instrument'}
        </Button>
        <Button onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}

const accuracyWords = (i: Instrument) =>
  READING_QUANTITIES.filter((q) => i.accuracy[q]).map((q) => {
    const a = i.accuracy[q]!;
    return `${QUANTITY_SHORT[q]} ±(${a.pctOfReading} % + ${a.counts} × ${formatValue(a.resolution, QUANTITY_UNIT[q])})`;
  });

export function InstrumentsBlock() {
  const canWrite = useCan('instruments');
  const instruments = useInstruments();
  const [editing, setEditing] = useState<Instrument | 'new' | null>(null);
  if (instruments.isPending) return <Loading what="Loading instruments" />;
  if (instruments.isError) return <Alert>{instruments.error.message}</Alert>;
  return (
    <div className="space-y-4">
      <div className="overflow-x-auto">
        <table className="w-full min-w-[680px] border-collapse text-sm">
          <caption className="sr-only">Instruments and their calibration</caption>
          <thead>
            <tr className="border-b border-paper-edge text-left text-xs uppercase tracking-wide text-ink-soft">
              <th scope="col" className="py-2 pr-3 font-medium">
                Name
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Kind
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Serial
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Accuracy
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Calibration due
              </th>
              {canWrite && (
                <th scope="col" className="py-2 font-medium">
                  <span className="sr-only">Actions</span>
                </th>
              )}
            </tr>
          </thead>
          <tbody>
            {instruments.data.instruments.map((i) => (
              <tr key={i.id} className="border-b border-paper-edge/70 align-top last:border-0">
                <td className="py-2 pr-3 font-medium">{i.name}</td>
                <td className="py-2 pr-3">{KIND_LABEL[i.kind]}</td>
                <td className="py-2 pr-3 font-mono text-xs">{i.serial ?? '—'}</td>
                <td className="num py-2 pr-3 text-xs">
                  {accuracyWords(i).map((w) => (
                    <span key={w} className="block">
                      {w}
                    </span>
                  ))}
                </td>
                <td className="num py-2 pr-3 whitespace-nowrap">
                  {i.calibrationDue ?? '—'}
                  {i.calibrationOverdue && (
                    <OverdueMark title="The calibration date has passed: readings taken with this instrument are marked" />
                  )}
                </td>
                {canWrite && (
                  <td className="py-1 text-right">
                    <Button size="sm" variant="quiet" onClick={() => setEditing(i)} aria-label={`Edit ${i.name}`}>
                      Edit
                    </Button>
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {canWrite &&
        (editing ? (
          <InstrumentForm
            key={editing === 'new' ? 'new' : editing.id}
            instrument={editing === 'new' ? undefined : editing}
            onDone={() => setEditing(null)}
          />
        ) : (
          <Button onClick={() => setEditing('new')}>New instrument…</Button>
        ))}
    </div>
  );
}
