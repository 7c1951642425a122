import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, type FieldErrors, type UseFormRegister } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { PART_KINDS, type PartKind } from '@shared/schemas/common';
import { NOMINAL_QUANTITY, type Part } from '@shared/schemas/parts';
import { TAPER_LAW_LABEL, TAPER_LAWS } from '@shared/taper/law';
import { formatValue } from '@shared/units/format';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';
import { applyServerError } from '@/lib/form';
import { useCreatePart } from '@/data/parts';
import { useUpdatePart } from '../api/update-part';
import {
  CreatePartFormSchema,
  PART_FORM_FIELDS,
  UpdatePartFormSchema,
  emptyPartForm,
  parseNominal,
  partToForm,
  type PartFormValues,
} from './part-form-schema';

export const KIND_LABEL: Record<PartKind, string> = {
  pot: 'Pot',
  capacitor: 'Capacitor',
  resistor: 'Resistor',
  pickup: 'Pickup',
  other: 'Other',
};

const NOMINAL_EXAMPLES: Record<(typeof NOMINAL_QUANTITY)[PartKind], string> = {
  resistance: 'Engineering notation: 500k, 4k7, 1meg, 250 kΩ',
  capacitance: 'Engineering notation: 22n, 2n2, 0.047u, 470 pF',
};

interface FieldsProps {
  register: UseFormRegister<PartFormValues>;
  errors: FieldErrors<PartFormValues>;
  kind: PartKind;
  nominalText: string;
  kindLocked?: boolean;
  /** Four columns on wide screens (the full-width new-part panel); three in a narrower column. */
  wide?: boolean;
}

/** The fields shared by the new-part and edit forms. */
function PartFields({ register, errors, kind, nominalText, kindLocked, wide }: FieldsProps) {
  const parsed = parseNominal(kind, nominalText);
  const nominalHint =
    parsed.ok && parsed.value !== null ? (
      <span aria-live="polite">
        Reads as <span className="num text-ink">{formatValue(parsed.value, parsed.unit)}</span>
        {'readAs' in parsed && parsed.readAs ? ' (a bare decimal on a capacitor is µF)' : ''}
      </span>
    ) : (
      NOMINAL_EXAMPLES[NOMINAL_QUANTITY[kind]] + (kind === 'pickup' ? ' (DC resistance)' : '')
    );
  return (
    <div className={`grid gap-4 sm:grid-cols-2 ${wide ? 'lg:grid-cols-4' : 'xl:grid-cols-3'}`}>
      {kindLocked ? (
        // A part's kind is fixed once it exists (its readings depend on it).
        <TextField label="Kind" readOnly value={KIND_LABEL[kind]} hint="Fixed once the part exists" />
      ) : (
        <SelectField label="Kind" error={errors.kind?.message} {...register('kind')}>
          {PART_KINDS.map((k) => (
            <option key={k} value={k}>
              {KIND_LABEL[k]}
            </option>
          ))}
        </SelectField>
      )}
      <TextField
        label="Label"
        autoComplete="off"
        hint="Printable and unique, e.g. P-0142"
        error={errors.label?.message}
        {...register('label')}
      />
      <TextField
        label="Nominal"
        autoComplete="off"
        spellCheck={false}
        inputClassName="num"
        hint={nominalHint}
        error={errors.nominal?.message}
        {...register('nominal')}
      />
      <TextField
        label="Tolerance (%)"
        autoComplete="off"
        inputClassName="num"
        hint="One number for ±, or two sides such as −20/+80"
        error={errors.tolerancePct?.message}
        {...register('tolerancePct')}
      />
      <TextField
        label="Marking"
        autoComplete="off"
        spellCheck={false}
        hint="As printed, e.g. 223J or A500K"
        error={errors.marking?.message}
        {...register('marking')}
      />
      {kind === 'pot' && (
        <SelectField label="Taper class" error={errors.taperClass?.message} {...register('taperClass')}>
          <option value="">Not given</option>
          {TAPER_LAWS.map((t) => (
            <option key={t} value={t}>
              {TAPER_LAW_LABEL[t]}
            </option>
          ))}
        </SelectField>
      )}
      <TextField label="Supplier" autoComplete="off" error={errors.supplier?.message} {...register('supplier')} />
      <TextAreaField
        label="Notes"
        className={`sm:col-span-2 ${wide ? 'lg:col-span-4' : 'xl:col-span-3'}`}
        rows={2}
        error={errors.notes?.message}
        {...register('notes')}
      />
    </div>
  );
}

/** New part. Stays open after saving (kind and supplier kept) so a batch goes in quickly. */
export function CreatePartForm({ onClose }: { onClose: () => void }) {
  const create = useCreatePart();
  const [created, setCreated] = useState<Part | null>(null);
  const form = useForm({ resolver: zodResolver(CreatePartFormSchema), defaultValues: emptyPartForm() });
  const { errors } = form.formState;
  const kind = form.watch('kind');
  const nominalText = form.watch('nominal');

  const onSubmit = form.handleSubmit(async (input) => {
    setCreated(null);
    try {
      const part = await create.mutateAsync(input);
      setCreated(part);
      const kept = form.getValues();
      form.reset({ ...emptyPartForm(kept.kind), supplier: kept.supplier, tolerancePct: kept.tolerancePct, taperClass: kept.taperClass });
      form.setFocus('label');
    } catch (err) {
      applyServerError(err, form.setError, PART_FORM_FIELDS);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby="new-part-heading" className="space-y-4">
      <h2 id="new-part-heading" className="text-base font-semibold">
        New part
      </h2>
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      {created && (
        <Alert tone="success">
          Saved{' '}
          <Link to={paths.app.part.getHref(created.id)} className="font-medium underline">
            {created.label}
          </Link>
          . Enter the next part, or close the form.
        </Alert>
      )}
      <PartFields register={form.register} errors={errors} kind={kind} nominalText={nominalText} wide />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" busy={create.isPending} busyText="Saving…">
          Save part
        </Button>
        <Button onClick={onClose}>Close</Button>
      </div>
    </form>
  );
}

/** Edit a part's fields; only the fields that were changed are sent. */
export function EditPartForm({ part, onDone }: { part: Part; onDone: () => void }) {
  const update = useUpdatePart();
  const form = useForm({ resolver: zodResolver(UpdatePartFormSchema), defaultValues: partToForm(part) });
  const { errors, dirtyFields } = form.formState;
  const nominalText = form.watch('nominal');

  const onSubmit = form.handleSubmit(async (input) => {
    const changed = Object.fromEntries(Object.entries(input).filter(([key]) => dirtyFields[key as keyof PartFormValues]));
    if (Object.keys(changed).length === 0) return onDone();
    try {
      await update.mutateAsync({ id: part.id, input: changed });
      onDone();
    } catch (err) {
      applyServerError(err, form.setError, PART_FORM_FIELDS);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label={`Edit ${part.label}`} className="space-y-4">
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <PartFields register={form.register} errors={errors} kind={part.kind} nominalText={nominalText} kindLocked />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" busy={update.isPending} busyText="Saving…">
          Save changes
        </Button>
        <Button onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}
