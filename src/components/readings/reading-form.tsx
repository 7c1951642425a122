// The reading form of the Bench and the part page: quantity, value in engineering notation, test
// frequency, instrument. The verdict is computed in the browser as the user types (the same
// judgeReading the server uses), and the server's stored verdict is shown after saving.
import { EsrDischargeNote } from '@/components/safety/safety-notes';
import { zodResolver } from '@hookform/resolvers/zod';
import { forwardRef, useImperativeHandle, useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { CreateReadingInputSchema, READING_QUANTITIES, ReadingQuantitySchema, type ReadingQuantity } from '@shared/schemas/bench';
import type { Verdict } from '@shared/schemas/common';
import { formatValue } from '@shared/units/format';
import { tryParseValue } from '@shared/units/parse';
import { QUANTITY_UNIT } from '@shared/units/quantities';
import { Alert } from '@/components/ui/alert';
import { VerdictBadge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { applyServerError } from '@/lib/form';
import type { Instrument } from '@/data/instruments';
import type { Profile } from '@/data/profiles';
import { useCreateReading, type CreatedReading } from '@/data/readings';
import { chooseProfile } from '@shared/analysis/profile-match';
import { previewVerdict, type JudgedPart } from './profile-chooser';
import { DEFAULT_QUANTITY, QUANTITY_EXAMPLES, QUANTITY_NAME, formatReading } from './words';

const ReadingFormFields = z.object({
  quantity: ReadingQuantitySchema,
  value: z.string(),
  frequency: z.string(),
  instrumentId: z.string(),
});
type ReadingFormValues = z.input<typeof ReadingFormFields>;
const FIELDS = ['quantity', 'value', 'frequency', 'instrumentId'] as const;

/** Text as typed → the API's input, checked with the shared CreateReadingInputSchema. */
const ReadingFormSchema = ReadingFormFields.transform((v, ctx) => {
  const value =
    v.value.trim() === '' ? ({ ok: false, error: 'Type the reading, e.g. 487k.' } as const) : tryParseValue(v.value, v.quantity);
  if (!value.ok) ctx.addIssue({ code: 'custom', path: ['value'], message: value.error });
  const frequency = v.frequency.trim() === '' ? ({ ok: true, value: null } as const) : tryParseValue(v.frequency, 'frequency');
  if (!frequency.ok) ctx.addIssue({ code: 'custom', path: ['frequency'], message: frequency.error });
  if (!value.ok || !frequency.ok) return z.NEVER;
  const checked = CreateReadingInputSchema.safeParse({
    quantity: v.quantity,
    value: value.value,
    frequency: frequency.value,
    instrumentId: v.instrumentId ? Number(v.instrumentId) : null,
  });
  if (!checked.success) {
    for (const issue of checked.error.issues)
      ctx.addIssue({ code: 'custom', path: [String(issue.path[0] ?? 'value')], message: issue.message });
    return z.NEVER;
  }
  return checked.data;
});

/** Instruments in a select: an overdue one says so in its own words (not by colour alone). */
export function instrumentOptionLabel(i: Instrument): string {
  return i.calibrationOverdue ? `${i.name} — calibration overdue` : i.name;
}

/** The instrument a new form starts with: one in calibration that states an accuracy for the quantity. */
function defaultInstrument(instruments: readonly Instrument[], quantity: ReadingQuantity): string {
  const good = instruments.find((i) => !i.calibrationOverdue && i.accuracy[quantity]);
  return good ? String(good.id) : '';
}

function VerdictPanel({
  title,
  verdict,
  reason,
  source,
  note,
}: {
  title: string;
  verdict: Verdict | null;
  reason: string;
  source?: string;
  note?: string;
}) {
  const tone =
    verdict === 'pass'
      ? 'border-pass/40 bg-pass-tint/50'
      : verdict === 'fail'
        ? 'border-fail/40 bg-fail-tint/50'
        : verdict === 'marginal'
          ? 'border-marginal/40 bg-marginal-tint/50'
          : 'border-paper-edge bg-paper-deep/40';
  return (
    <div className={`rounded-md border p-3 ${tone}`}>
      <p className="flex flex-wrap items-center gap-2 text-xs font-medium uppercase tracking-wide text-ink-soft">
        {title}
        {verdict && <VerdictBadge verdict={verdict} reason={reason} />}
      </p>
      <p className="mt-1.5 text-sm text-ink">{reason}</p>
      {source && <p className="mt-1 text-xs text-ink-soft">Limits from the {source}.</p>}
      {note && <p className="mt-1 text-xs text-ink-soft">{note}</p>}
    </div>
  );
}

export interface ReadingFormHandle {
  focusValue: () => void;
}

interface ReadingFormProps {
  part: JudgedPart & { id: number; label: string };
  profiles: readonly Profile[];
  instruments: readonly Instrument[];
  /** Called with the server's answer after each saved reading. */
  onSaved?: (saved: CreatedReading) => void;
  /** Bench: large value field with focus on it; part page: compact. */
  size?: 'bench' | 'compact';
  autoFocus?: boolean;
}

export const ReadingForm = forwardRef<ReadingFormHandle, ReadingFormProps>(function ReadingForm(
  { part, profiles, instruments, onSaved, size = 'compact', autoFocus },
  ref,
) {
  const create = useCreateReading();
  const [saved, setSaved] = useState<CreatedReading | null>(null);
  const firstQuantity = DEFAULT_QUANTITY[part.kind];
  const form = useForm<ReadingFormValues, unknown, z.output<typeof ReadingFormSchema>>({
    resolver: zodResolver(ReadingFormSchema),
    defaultValues: { quantity: firstQuantity, value: '', frequency: '', instrumentId: defaultInstrument(instruments, firstQuantity) },
  });
  useImperativeHandle(ref, () => ({ focusValue: () => form.setFocus('value') }), [form]);
  const { errors } = form.formState;
  const [quantity, valueText, instrumentId] = form.watch(['quantity', 'value', 'instrumentId']);
  const instrument = instruments.find((i) => String(i.id) === instrumentId) ?? null;
  const profile = useMemo(() => chooseProfile(profiles, part), [profiles, part]);

  // The live verdict: recomputed on every keystroke, nothing sent.
  const parsed = valueText.trim() === '' ? null : tryParseValue(valueText, quantity);
  const live = parsed?.ok ? previewVerdict(part, { quantity, value: parsed.value }, profiles, instrument) : null;
  const accuracy = instrument?.accuracy[quantity];

  const onSubmit = form.handleSubmit(async (input) => {
    setSaved(null);
    try {
      const result = await create.mutateAsync({ partId: part.id, input });
      setSaved(result);
      onSaved?.(result);
      form.reset({ ...form.getValues(), value: '' });
      form.setFocus('value');
    } catch (err) {
      applyServerError(err, form.setError, FIELDS);
    }
  });

  const quantityField = form.register('quantity', {
    onChange: (e: { target: { value: ReadingQuantity } }) => {
      // Keep the chosen instrument unless it has nothing to say about the new quantity.
      if (!instrument?.accuracy[e.target.value])
        form.setValue('instrumentId', defaultInstrument(instruments, e.target.value) || form.getValues('instrumentId'));
    },
  });
  const bench = size === 'bench';

  return (
    <form onSubmit={onSubmit} noValidate aria-label={`New reading of ${part.label}`} className="space-y-4">
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Quantity" error={errors.quantity?.message} {...quantityField}>
          {READING_QUANTITIES.map((q) => (
            <option key={q} value={q}>
              {QUANTITY_NAME[q]}
            </option>
          ))}
        </SelectField>
        {quantity === 'esr' && <EsrDischargeNote className="sm:col-span-2" />}
        <TextField
          label={`Value${QUANTITY_UNIT[quantity] ? ` (${QUANTITY_UNIT[quantity]})` : ''}`}
          autoComplete="off"
          spellCheck={false}
          autoFocus={autoFocus}
          inputClassName={`num ${bench ? 'text-xl sm:text-xl py-2.5' : ''}`}
          hint={
            parsed?.ok ? (
              <span>
                Reads as <span className="num text-ink">{formatReading(quantity, parsed.value)}</span>
                {parsed.readAs ? ' (a bare decimal on a capacitor is µF)' : ''} · Enter saves
              </span>
            ) : (
              QUANTITY_EXAMPLES[quantity]
            )
          }
          error={errors.value?.message ?? (parsed && !parsed.ok ? parsed.error : undefined)}
          {...form.register('value')}
        />
        <TextField
          label="Test frequency (optional)"
          autoComplete="off"
          spellCheck={false}
          inputClassName="num"
          hint="e.g. 1k, 120 Hz"
          error={errors.frequency?.message}
          {...form.register('frequency')}
        />
        <SelectField
          label="Instrument"
          hint={
            instrument?.calibrationOverdue
              ? `Calibration was due ${instrument.calibrationDue}: the reading will be marked.`
              : accuracy
                ? instrument?.displayCounts
                  ? // The verdict sizes one count by the reading's range (range ÷ display counts), so the hint does too.
                    `±(${accuracy.pctOfReading} % + ${accuracy.counts} counts; one count is the range ÷ ${instrument.displayCounts})`
                  : `±(${accuracy.pctOfReading} % + ${accuracy.counts} × ${formatValue(accuracy.resolution, QUANTITY_UNIT[quantity])})`
                : instrument
                  ? 'No accuracy given for this quantity: simple acceptance.'
                  : 'Without an instrument the verdict uses no guard band.'
          }
          error={errors.instrumentId?.message}
          {...form.register('instrumentId')}
        >
          <option value="">No instrument</option>
          {instruments.map((i) => (
            <option key={i.id} value={i.id}>
              {instrumentOptionLabel(i)}
            </option>
          ))}
        </SelectField>
      </div>

      {/* At the bench on a phone the verdict stays pinned to the bottom of the screen while the form is in view. */}
      <div
        aria-live="polite"
        className={bench ? 'max-sm:sticky max-sm:bottom-2 max-sm:z-10 max-sm:rounded-md max-sm:bg-paper max-sm:shadow-md' : undefined}
      >
        {live ? (
          <VerdictPanel title="Verdict as typed" verdict={live.verdict} reason={live.reason} source={live.source} />
        ) : parsed?.ok ? (
          <VerdictPanel
            title="Verdict as typed"
            verdict={null}
            reason={`No limit applies to a ${QUANTITY_NAME[quantity].toLowerCase()} reading of this part; it is kept as information.`}
            note={
              profile ? `Profile in use: ${profile.name}.` : 'No tolerance profile matches this part and it has no tolerance of its own.'
            }
          />
        ) : null}
      </div>

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" variant="primary" busy={create.isPending} busyText="Saving…">
          Save reading
        </Button>
        {bench && <span className="text-xs text-ink-soft">Enter saves · Esc goes back to the part search</span>}
      </div>

      {saved && (
        <div role="status">
          <VerdictPanel
            title={`Saved for ${saved.part.label} · server verdict`}
            verdict={saved.reading.verdict}
            reason={
              saved.reading.verdictReason ??
              `${formatReading(saved.reading.quantity, saved.reading.value)} recorded; no limit applies, so no verdict.`
            }
            note={
              saved.reading.calibrationOverdue ? 'Taken with an instrument whose calibration is overdue: the reading is marked.' : undefined
            }
          />
        </div>
      )}
    </form>
  );
});
