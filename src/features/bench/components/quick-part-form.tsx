// A part created on the spot at the bench: kind, label, nominal, tolerance (and taper class for a
// pot). Everything else can be added later on the part page.
import { parseToleranceText } from '@shared/analysis/tolerance';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { PART_KINDS, PartKindSchema, type PartKind } from '@shared/schemas/common';
import { CreatePartInputSchema, NOMINAL_QUANTITY, type Part } from '@shared/schemas/parts';
import { TAPER_LAW_LABEL, TAPER_LAWS } from '@shared/taper/law';
import { formatValue } from '@shared/units/format';
import { tryParseValue } from '@shared/units/parse';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { applyServerError } from '@/lib/form';
import { useCreatePart } from '@/data/parts';

const KIND_LABEL: Record<PartKind, string> = { pot: 'Pot', capacitor: 'Capacitor', resistor: 'Resistor', pickup: 'Pickup', other: 'Other' };

const Fields = z.object({ kind: PartKindSchema, label: z.string(), nominal: z.string(), tolerancePct: z.string(), taperClass: z.string() });
type Values = z.input<typeof Fields>;
const FIELD_NAMES = ['kind', 'label', 'nominal', 'tolerancePct', 'taperClass'] as const;

const Schema = Fields.transform((v, ctx) => {
  const nominal = v.nominal.trim() === '' ? ({ ok: true, value: null } as const) : tryParseValue(v.nominal, NOMINAL_QUANTITY[v.kind]);
  if (!nominal.ok) ctx.addIssue({ code: 'custom', path: ['nominal'], message: nominal.error });
  // One number for ±, or two sides (−20/+80), as on the part form.
  const tol = parseToleranceText(v.tolerancePct);
  if (!tol.ok) ctx.addIssue({ code: 'custom', path: ['tolerancePct'], message: tol.error });
  const tolerance = tol.ok ? tol.value : null;
  const checked = CreatePartInputSchema.safeParse({
    kind: v.kind,
    label: v.label,
    nominal: nominal.ok ? nominal.value : null,
    tolerancePct: tolerance?.minusPct ?? null,
    tolerancePlusPct: tolerance?.plusPct ?? null,
    taperClass: v.kind === 'pot' && v.taperClass ? v.taperClass : null,
  });
  if (!checked.success)
    for (const issue of checked.error.issues)
      ctx.addIssue({
        code: 'custom',
        path: [issue.path[0] === 'tolerancePlusPct' ? 'tolerancePct' : String(issue.path[0] ?? 'label')],
        message: issue.message,
      });
  if (!nominal.ok || !tol.ok || !checked.success) return z.NEVER;
  return checked.data;
});

export function QuickPartForm({ label, onCreated, onCancel }: { label: string; onCreated: (part: Part) => void; onCancel: () => void }) {
  const create = useCreatePart();
  const form = useForm<Values, unknown, z.output<typeof Schema>>({
    resolver: zodResolver(Schema),
    defaultValues: { kind: 'pot', label, nominal: '', tolerancePct: '', taperClass: '' },
  });
  const { errors } = form.formState;
  const [kind, nominalText] = form.watch(['kind', 'nominal']);
  const parsed = nominalText.trim() ? tryParseValue(nominalText, NOMINAL_QUANTITY[kind]) : null;

  const onSubmit = form.handleSubmit(async (input) => {
    try {
      onCreated(await create.mutateAsync(input));
    } catch (err) {
      applyServerError(err, form.setError, FIELD_NAMES);
    }
  });

  return (
    // Escape from any field cancels: the wrapper only catches the keys its fields let bubble.
    <div role="presentation" onKeyDown={(e) => e.key === 'Escape' && onCancel()}>
      <form onSubmit={onSubmit} noValidate aria-labelledby="quick-part-heading" className="space-y-3">
        <h3 id="quick-part-heading" className="text-sm font-semibold">
          New part
        </h3>
        {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
        <div className="grid gap-3 sm:grid-cols-2">
          <SelectField label="Kind" autoFocus error={errors.kind?.message} {...form.register('kind')}>
            {PART_KINDS.map((k) => (
              <option key={k} value={k}>
                {KIND_LABEL[k]}
              </option>
            ))}
          </SelectField>
          <TextField label="Label" autoComplete="off" error={errors.label?.message} {...form.register('label')} />
          <TextField
            label={`Nominal (${NOMINAL_QUANTITY[kind] === 'capacitance' ? 'F' : 'Ω'})`}
            autoComplete="off"
            spellCheck={false}
            inputClassName="num"
            hint={
              parsed?.ok ? (
                <span>
                  Reads as <span className="num text-ink">{formatValue(parsed.value, parsed.unit)}</span>
                  {parsed.readAs ? ' (a bare decimal on a capacitor is µF)' : ''}
                </span>
              ) : NOMINAL_QUANTITY[kind] === 'capacitance' ? (
                'e.g. 22n, 0.047u'
              ) : (
                'e.g. 500k, 4k7, 1meg'
              )
            }
            error={errors.nominal?.message}
            {...form.register('nominal')}
          />
          <TextField
            label="Tolerance (±%)"
            inputMode="decimal"
            autoComplete="off"
            inputClassName="num"
            hint="Blank: the profile's"
            error={errors.tolerancePct?.message}
            {...form.register('tolerancePct')}
          />
          {kind === 'pot' && (
            <SelectField label="Taper class" error={errors.taperClass?.message} {...form.register('taperClass')}>
              <option value="">Not given</option>
              {TAPER_LAWS.map((t) => (
                <option key={t} value={t}>
                  {TAPER_LAW_LABEL[t]}
                </option>
              ))}
            </SelectField>
          )}
        </div>
        <div className="flex flex-wrap gap-2">
          <Button type="submit" variant="primary" busy={create.isPending} busyText="Creating…">
            Create and measure
          </Button>
          <Button onClick={onCancel}>Cancel</Button>
        </div>
      </form>
    </div>
  );
}
