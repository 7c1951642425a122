// The part form holds text as typed; this schema turns it into the API's input and then checks it
// with the shared schema (CreatePartInputSchema / UpdatePartInputSchema), so the rules live in one
// place. The nominal is read in engineering notation for the quantity of the part's kind.
import { z } from 'zod';
import { parseToleranceText, type TwoSidedTolerance } from '@shared/analysis/tolerance';
import { PartKindSchema, type PartKind } from '@shared/schemas/common';
import { CreatePartInputSchema, NOMINAL_QUANTITY, UpdatePartInputSchema, type Part } from '@shared/schemas/parts';
import { formatValue } from '@shared/units/format';
import { tryParseValue } from '@shared/units/parse';
import { QUANTITY_UNIT } from '@shared/units/quantities';
import { toleranceText } from '@/lib/format';

const PartFormFields = z.object({
  kind: PartKindSchema,
  label: z.string(),
  nominal: z.string(),
  tolerancePct: z.string(),
  marking: z.string(),
  taperClass: z.string(),
  supplier: z.string(),
  notes: z.string(),
});

export type PartFormValues = z.input<typeof PartFormFields>;
export const PART_FORM_FIELDS = ['kind', 'label', 'nominal', 'tolerancePct', 'marking', 'taperClass', 'supplier', 'notes'] as const;

const blankToNull = (s: string) => (s.trim() === '' ? null : s.trim());

/**
 * "10", "±10 %", "10,5%" → both sides 10; "−20/+80" → 20 below, 80 above (a Z part); blank → null;
 * anything else → an error message.
 */
export function parseTolerance(text: string): { ok: true; value: TwoSidedTolerance | null } | { ok: false; error: string } {
  const r = parseToleranceText(text);
  if (r.ok) return r;
  return { ok: false, error: `"${text.trim()}" is not a tolerance; ${r.error.charAt(0).toLowerCase()}${r.error.slice(1)}` };
}

/** The nominal as typed, read for the kind's quantity: "500k" on a pot → 500000 Ω. */
export function parseNominal(kind: PartKind, text: string) {
  if (text.trim() === '') return { ok: true as const, value: null, unit: QUANTITY_UNIT[NOMINAL_QUANTITY[kind]] };
  return tryParseValue(text, NOMINAL_QUANTITY[kind]);
}

function intoInput<S extends z.ZodType>(target: S) {
  return (v: z.output<typeof PartFormFields>, ctx: z.RefinementCtx): z.output<S> => {
    let failed = false;
    const fail = (path: string, message: string) => {
      failed = true;
      ctx.addIssue({ code: 'custom', path: [path], message });
    };
    const nominal = parseNominal(v.kind, v.nominal);
    if (!nominal.ok) fail('nominal', nominal.error);
    const tolerance = parseTolerance(v.tolerancePct);
    if (!tolerance.ok) fail('tolerancePct', tolerance.error);

    const candidate = {
      kind: v.kind,
      label: v.label,
      nominal: nominal.ok ? nominal.value : null,
      tolerancePct: tolerance.ok ? (tolerance.value?.minusPct ?? null) : null,
      tolerancePlusPct: tolerance.ok ? (tolerance.value?.plusPct ?? null) : null,
      marking: blankToNull(v.marking),
      // Only pots have a taper.
      taperClass: v.kind === 'pot' ? blankToNull(v.taperClass) : null,
      supplier: blankToNull(v.supplier),
      notes: blankToNull(v.notes),
    };
    const checked = target.safeParse(candidate);
    if (!checked.success) {
      for (const issue of checked.error.issues) {
        const field = String(issue.path[0] ?? 'label');
        // A field that failed to parse already has its message.
        if ((field === 'nominal' && !nominal.ok) || (field === 'tolerancePct' && !tolerance.ok)) continue;
        // The form has one tolerance field for both sides.
        fail(field === 'tolerancePlusPct' ? 'tolerancePct' : field, issue.message);
      }
    }
    if (failed || !checked.success) return z.NEVER;
    return checked.data;
  };
}

export const CreatePartFormSchema = PartFormFields.transform(intoInput(CreatePartInputSchema));
/** For editing; `kind` is not sent (the update schema has no kind and strips it). */
export const UpdatePartFormSchema = PartFormFields.transform(intoInput(UpdatePartInputSchema));

export const emptyPartForm = (kind: PartKind = 'pot'): PartFormValues => ({
  kind,
  label: '',
  nominal: '',
  tolerancePct: '',
  marking: '',
  taperClass: '',
  supplier: '',
  notes: '',
});

/** A part's values as form text. The nominal keeps all its digits, so saving unchanged text changes nothing. */
export function partToForm(part: Part): PartFormValues {
  return {
    kind: part.kind,
    label: part.label,
    nominal: part.nominal === null ? '' : formatValue(part.nominal, QUANTITY_UNIT[NOMINAL_QUANTITY[part.kind]], { digits: 12 }),
    tolerancePct: toleranceText(part.tolerancePct, part.tolerancePlusPct),
    marking: part.marking ?? '',
    taperClass: part.taperClass ?? '',
    supplier: part.supplier ?? '',
    notes: part.notes ?? '',
  };
}
