import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { LOT_KINDS } from '@shared/schemas/lots';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';
import { useUser } from '@/lib/auth';
import { applyServerError } from '@/lib/form';
import { ROLE_LABEL, toleranceText } from '@/lib/format';
import { useCreateLot } from '../api/create-lot';
import { useMembers } from '../api/get-members';
import { useInstruments } from '@/data/instruments';
import {
  CreateLotFormSchema,
  LOT_FORM_FIELDS,
  LOT_KIND_LABEL,
  SECOND_CHOICES,
  emptyLotForm,
  readNominal,
  type LotFormValues,
} from './lot-form-schema';

const NOMINAL_HINT = {
  capacitor: 'Value (47n, 0.047u) or the marking as printed (473J, 104K, 2n2J)',
  pot: 'Value (500k, 250k, 1meg) or a code such as 4K7',
  resistor: 'Value (4k7, 1meg) or a code such as 4K7, 470R',
} as const;

/** Watchers: qa leads and admins choose any member; others can only add themselves. */
function WatcherChoice({ value, onChange, error }: { value: string[]; onChange: (ids: string[]) => void; error?: string }) {
  const user = useUser();
  const isAdmin = user?.role === 'admin' || user?.role === 'qa';
  const members = useMembers(isAdmin);
  const toggle = (id: string, on: boolean) => onChange(on ? [...new Set([...value, id])] : value.filter((x) => x !== id));
  return (
    <fieldset className="sm:col-span-2 lg:col-span-4">
      <legend className="mb-1 text-sm font-medium">Watchers</legend>
      <p className="mb-2 text-xs text-ink-soft">Watchers get an e-mail when the lot’s disposition is recorded and when it is reopened.</p>
      {isAdmin ? (
        members.isPending ? (
          <p className="text-sm text-ink-soft">Loading members…</p>
        ) : members.isError ? (
          <Alert>{members.error.message}</Alert>
        ) : (
          <div className="flex flex-wrap gap-x-5 gap-y-2">
            {members.data.members.map((m) => (
              <label key={m.id} className="inline-flex min-h-8 items-center gap-2 text-sm">
                <input
                  type="checkbox"
                  className="size-4 accent-accent"
                  checked={value.includes(m.id)}
                  onChange={(e) => toggle(m.id, e.target.checked)}
                />
                {m.name} <span className="text-xs text-ink-soft">({ROLE_LABEL[m.role]})</span>
              </label>
            ))}
          </div>
        )
      ) : user ? (
        <label className="inline-flex min-h-8 items-center gap-2 text-sm">
          <input
            type="checkbox"
            className="size-4 accent-accent"
            checked={value.includes(user.id)}
            onChange={(e) => toggle(user.id, e.target.checked)}
          />
          Watch this lot myself ({user.email})
        </label>
      ) : null}
      {error && <p className="mt-1 text-sm text-fail">{error}</p>}
    </fieldset>
  );
}

export function CreateLotForm({ onClose }: { onClose: () => void }) {
  const user = useUser();
  const create = useCreateLot();
  const navigate = useNavigate();
  const form = useForm<LotFormValues, unknown, import('@shared/schemas/lots').CreateLotInput>({
    resolver: zodResolver(CreateLotFormSchema),
    defaultValues: emptyLotForm('capacitor', user ? [user.id] : []),
  });
  const { errors } = form.formState;
  const kind = form.watch('kind');
  const nominalText = form.watch('nominal');
  const secondQuantity = form.watch('secondQuantity');
  const watcherIds = form.watch('watcherIds');
  const instruments = useInstruments();
  const reading = readNominal(kind, nominalText);
  const secondChoices = SECOND_CHOICES[kind];
  const secondChoice = secondChoices.find((c) => c.value === secondQuantity);

  const nominalHint =
    reading.ok && !reading.empty ? (
      <span aria-live="polite">
        Reads as <span className="num font-medium text-ink">{reading.text}</span>
        {reading.marking ? ` (marking ${reading.marking})` : ''}
      </span>
    ) : (
      NOMINAL_HINT[kind]
    );
  // A typed value that does not read is shown at the field at once, not only on saving.
  const nominalError = errors.nominal?.message ?? (!reading.ok && nominalText.trim().length >= 2 ? reading.error : undefined);

  const onSubmit = form.handleSubmit(async (input) => {
    try {
      const lot = await create.mutateAsync(input);
      onClose();
      navigate(paths.app.lot.getHref(lot.id));
    } catch (err) {
      applyServerError(err, form.setError, LOT_FORM_FIELDS);
      // The server names a decoded marking's problem under "marking"; this form types it as the nominal.
      const fields = (err as { fields?: Record<string, string> }).fields;
      if (fields?.marking) form.setError('nominal', { type: 'server', message: fields.marking });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby="new-lot-heading" className="space-y-4">
      <h2 id="new-lot-heading" className="text-base font-semibold">
        New lot
      </h2>
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <SelectField
          label="Kind"
          error={errors.kind?.message}
          {...form.register('kind', {
            onChange: () => {
              form.setValue('secondQuantity', '');
              form.setValue('secondLimit', '');
            },
          })}
        >
          {LOT_KINDS.map((k) => (
            <option key={k} value={k}>
              {LOT_KIND_LABEL[k]}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Nominal or marking"
          autoComplete="off"
          spellCheck={false}
          inputClassName="num"
          placeholder={kind === 'capacitor' ? '473J' : '500k'}
          hint={nominalHint}
          error={nominalError}
          {...form.register('nominal')}
        />
        <TextField
          label="Tolerance (%)"
          autoComplete="off"
          inputClassName="num"
          placeholder={
            reading.ok && !reading.empty && reading.tolerance != null
              ? `${toleranceText(reading.tolerance.minusPct, reading.tolerance.plusPct)} (from the marking)`
              : '5'
          }
          hint={
            reading.ok && !reading.empty && reading.tolerance != null
              ? 'Leave blank to use the marking’s letter'
              : 'One number for ±, or two sides such as −20/+80'
          }
          error={errors.tolerancePct?.message}
          {...form.register('tolerancePct')}
        />
        <TextField
          label="Lot code"
          autoComplete="off"
          hint="Optional; made from the date if blank"
          error={errors.code?.message}
          {...form.register('code')}
        />
        <TextField label="Supplier" autoComplete="off" error={errors.supplier?.message} {...form.register('supplier')} />
        <TextField label="Received on" type="date" error={errors.receivedOn?.message} {...form.register('receivedOn')} />
        <TextField
          label="Expected count"
          inputMode="numeric"
          autoComplete="off"
          inputClassName="num"
          placeholder="500"
          error={errors.expectedCount?.message}
          {...form.register('expectedCount')}
        />
        {secondChoices.length > 0 ? (
          <div className="grid grid-cols-2 gap-4 sm:col-span-2">
            <SelectField label="Second quantity" error={errors.secondQuantity?.message} {...form.register('secondQuantity')}>
              <option value="">None</option>
              {secondChoices.map((c) => (
                <option key={c.value} value={c.value}>
                  {c.label}
                </option>
              ))}
            </SelectField>
            <TextField
              label="Its limit"
              autoComplete="off"
              inputClassName="num"
              disabled={!secondChoice}
              hint={secondChoice?.hint}
              error={errors.secondLimit?.message}
              {...form.register('secondLimit')}
            />
          </div>
        ) : (
          <div className="sm:col-span-2" />
        )}
        <WatcherChoice
          value={watcherIds}
          onChange={(ids) => form.setValue('watcherIds', ids, { shouldDirty: true })}
          error={errors.watcherIds?.message}
        />
        <SelectField
          label="Instrument"
          hint="The meter the lot is measured with; its readings carry it when items become parts."
          error={errors.instrumentId?.message}
          {...form.register('instrumentId')}
        >
          <option value="">Not recorded</option>
          {instruments.data?.instruments.map((i) => (
            <option key={i.id} value={i.id}>
              {i.name}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Test frequency"
          placeholder="1k"
          hint="The LCR meter's test frequency in Hz (100, 1k …); blank if not recorded."
          autoComplete="off"
          inputClassName="num"
          error={errors.testFrequency?.message}
          {...form.register('testFrequency')}
        />
        <TextAreaField
          label="Notes"
          className="sm:col-span-2 lg:col-span-4"
          rows={2}
          error={errors.notes?.message}
          {...form.register('notes')}
        />
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" busy={create.isPending} busyText="Saving…">
          Create lot
        </Button>
        <Button onClick={onClose}>Cancel</Button>
      </div>
    </form>
  );
}
