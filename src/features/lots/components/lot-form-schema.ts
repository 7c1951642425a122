// The new-lot form holds text as typed; this schema reads it (engineering notation, a marking code,
// percentages) and then checks the result with the shared CreateLotInputSchema, so the rules the
// server applies are the ones the form shows.
import { z } from 'zod';
import { parseToleranceText, toleranceWords, type TwoSidedTolerance } from '@shared/analysis/tolerance';
import { decodeMarking } from '@shared/markings/decode';
import { CreateLotInputSchema, LOT_KINDS, type CreateLotInput } from '@shared/schemas/lots';
import { formatValue } from '@shared/units/format';
import { tryParseValue } from '@shared/units/parse';
import type { LotKind, SecondQuantity } from '../api/types';

export const LotFormFields = z.object({
  code: z.string(),
  kind: z.enum(LOT_KINDS),
  nominal: z.string(),
  tolerancePct: z.string(),
  supplier: z.string(),
  receivedOn: z.string(),
  expectedCount: z.string(),
  secondQuantity: z.string(),
  secondLimit: z.string(),
  instrumentId: z.string(),
  testFrequency: z.string(),
  watcherIds: z.array(z.string()),
  notes: z.string(),
});
export type LotFormValues = z.input<typeof LotFormFields>;
export const LOT_FORM_FIELDS = [
  'code',
  'kind',
  'nominal',
  'tolerancePct',
  'supplier',
  'receivedOn',
  'expectedCount',
  'secondQuantity',
  'secondLimit',
  'instrumentId',
  'testFrequency',
  'watcherIds',
  'notes',
] as const;

export const LOT_KIND_LABEL: Record<LotKind, string> = { capacitor: 'Capacitors', pot: 'Pots', resistor: 'Resistors' };
export const LOT_UNIT: Record<LotKind, string> = { capacitor: 'F', pot: 'Ω', resistor: 'Ω' };

/** Second quantities that make sense for each kind of lot (docs/computation.md §5). */
export const SECOND_CHOICES: Record<LotKind, { value: SecondQuantity; label: string; hint: string }[]> = {
  capacitor: [
    { value: 'dissipation', label: 'Dissipation factor D (max)', hint: 'A fraction or a percentage: 0.01 or 1 %' },
    { value: 'esr', label: 'ESR (max)', hint: 'Engineering notation: 2, 0.5, 150m' },
  ],
  pot: [{ value: 'end-resistance', label: 'End resistance (max)', hint: 'Engineering notation: 500, 1k' }],
  resistor: [],
};

export const SECOND_UNIT: Record<SecondQuantity, string> = { dissipation: '', esr: 'Ω', 'end-resistance': 'Ω' };
export const SECOND_LABEL: Record<SecondQuantity, string> = { dissipation: 'D', esr: 'ESR', 'end-resistance': 'End resistance' };

export type NominalReading =
  | { ok: true; empty: true }
  | {
      ok: true;
      empty: false;
      nominal: number;
      /** The marking's tolerance letter, both sides (Z: 20 below, 80 above); null without one. */
      tolerance: TwoSidedTolerance | null;
      marking: string | null;
      text: string;
    }
  | { ok: false; error: string };

// Two or three digits with an optional tolerance letter (473, 473J), or RKM with a tolerance letter
// (2n2J): on a capacitor these are markings, not a number of farads.
const CAP_CODE = /^\d{2,3}[A-Z]?$|^\d*[pnuµμ]\d*[A-Z]$/;

/**
 * The nominal as typed: engineering notation ("47n", "500k") or a marking code ("473J", "4K7").
 * A marking is decoded here with the same decoder the server uses, so the user sees "47 nF ±5 %"
 * before saving.
 */
export function readNominal(kind: LotKind, text: string): NominalReading {
  const t = text.trim();
  if (t === '') return { ok: true, empty: true };
  const quantity = kind === 'capacitor' ? 'capacitance' : 'resistance';
  const wantKind = kind === 'capacitor' ? 'capacitor' : 'resistor';
  // Set when the text is a marking at all (of either kind), so a wrong-kind marking is named as such.
  let decoded = false;
  const asMarking = (): NominalReading | null => {
    try {
      const all = decodeMarking(t);
      // An ambiguous code (10K: 10 pF ±10 % or 10 kΩ) is read the way that fits this lot's kind.
      const d = all.readings.find((r) => r.kind === wantKind) ?? all;
      decoded = true;
      if (d.kind !== wantKind)
        return {
          ok: false,
          error: `"${t}" is a ${d.kind} marking (${formatValue(d.nominal, d.unit)}), but this is a lot of ${LOT_KIND_LABEL[kind].toLowerCase()}.`,
        };
      const tol = d.tolerance;
      const tolerance =
        tol?.kind === 'percent'
          ? { minusPct: tol.pct, plusPct: tol.pct }
          : tol?.kind === 'asymmetric'
            ? { minusPct: tol.minusPct, plusPct: tol.plusPct }
            : null;
      return {
        ok: true,
        empty: false,
        nominal: d.nominal,
        tolerance,
        marking: t,
        text: formatValue(d.nominal, d.unit) + (tolerance ? ` ${toleranceWords(tolerance.minusPct, tolerance.plusPct)}` : ''),
      };
    } catch (err) {
      return { ok: false, error: err instanceof Error ? err.message : String(err) };
    }
  };
  if (kind === 'capacitor' && CAP_CODE.test(t.replace(/\s+/g, ''))) return asMarking()!;
  const parsed = tryParseValue(t, quantity);
  if (parsed.ok) {
    if (!(parsed.value > 0)) return { ok: false, error: 'The nominal must be above zero.' };
    return {
      ok: true,
      empty: false,
      nominal: parsed.value,
      tolerance: null,
      marking: null,
      text: formatValue(parsed.value, LOT_UNIT[kind]),
    };
  }
  const marking = asMarking();
  if (marking && (marking.ok || decoded)) return marking;
  return { ok: false, error: `${parsed.error} Or type a marking code such as ${kind === 'capacitor' ? '473J' : '4K7'}.` };
}

/** "5", "±5 %", "2,5" → both sides; "−20/+80" → 20 below and 80 above nominal; blank → null. */
export function readPercent(text: string): { ok: true; value: TwoSidedTolerance | null } | { ok: false; error: string } {
  const r = parseToleranceText(text);
  if (r.ok) return r;
  return { ok: false, error: `"${text.trim()}" is not a tolerance; ${r.error.charAt(0).toLowerCase()}${r.error.slice(1)}` };
}

/** The second-quantity limit in SI: D as a fraction ("1 %" → 0.01), ESR and end resistance in Ω. */
export function readSecondLimit(q: SecondQuantity, text: string): { ok: true; value: number | null } | { ok: false; error: string } {
  const t = text.trim();
  if (t === '') return { ok: true, value: null };
  if (q === 'dissipation') {
    const pct = t.endsWith('%');
    const n = Number(t.replace(/[%\s]/g, '').replace(',', '.'));
    if (!Number.isFinite(n)) return { ok: false, error: `"${t}" is not a dissipation factor; type 0.01 or 1 %.` };
    return { ok: true, value: pct ? n / 100 : n };
  }
  const r = tryParseValue(t, 'resistance');
  return r.ok ? { ok: true, value: r.value } : { ok: false, error: r.error };
}

const blankToNull = (s: string) => (s.trim() === '' ? null : s.trim());

export const CreateLotFormSchema = LotFormFields.transform((v, ctx): CreateLotInput => {
  let failed = false;
  const fail = (path: string, message: string) => {
    failed = true;
    ctx.addIssue({ code: 'custom', path: [path], message });
  };
  const nominal = readNominal(v.kind, v.nominal);
  if (!nominal.ok) fail('nominal', nominal.error);
  else if (nominal.empty)
    fail(
      'nominal',
      `Give the nominal value (${v.kind === 'capacitor' ? '47n' : '500k'}) or a marking code such as ${v.kind === 'capacitor' ? '473J' : '4K7'}.`,
    );
  const tol = readPercent(v.tolerancePct);
  if (!tol.ok) fail('tolerancePct', tol.error);
  else if (tol.value === null && !(nominal.ok && !nominal.empty && nominal.tolerance != null))
    fail('tolerancePct', 'Give the tolerance, or a marking with a tolerance letter (473J).');
  const second = (SECOND_CHOICES[v.kind].find((c) => c.value === v.secondQuantity)?.value ?? null) as SecondQuantity | null;
  const limit = second ? readSecondLimit(second, v.secondLimit) : ({ ok: true, value: null } as const);
  if (!limit.ok) fail('secondLimit', limit.error);
  else if (second && limit.value === null) fail('secondLimit', 'Give the limit, or choose “No second quantity”.');
  let expectedCount: number | null = null;
  if (v.expectedCount.trim() !== '') {
    expectedCount = Number(v.expectedCount.replace(/[\s,]/g, ''));
    if (!Number.isInteger(expectedCount)) fail('expectedCount', 'A whole number of parts, such as 500.');
  }
  let testFrequency: number | null = null;
  if (v.testFrequency.trim() !== '') {
    const f = tryParseValue(v.testFrequency.trim(), 'frequency');
    if (f.ok) testFrequency = f.value;
    else fail('testFrequency', f.error);
  }
  if (failed) return z.NEVER;

  const candidate = {
    ...(blankToNull(v.code) ? { code: v.code.trim() } : {}),
    kind: v.kind,
    ...(nominal.ok && !nominal.empty ? (nominal.marking ? { marking: nominal.marking } : { nominal: nominal.nominal }) : {}),
    ...(tol.ok && tol.value !== null ? { tolerancePct: tol.value.minusPct, tolerancePlusPct: tol.value.plusPct } : {}),
    supplier: blankToNull(v.supplier),
    receivedOn: blankToNull(v.receivedOn),
    expectedCount,
    secondQuantity: second,
    secondLimit: limit.ok ? limit.value : null,
    instrumentId: v.instrumentId ? Number(v.instrumentId) : null,
    testFrequency,
    watcherIds: v.watcherIds,
    notes: blankToNull(v.notes),
  };
  const checked = CreateLotInputSchema.safeParse(candidate);
  if (!checked.success) {
    // The form has one tolerance field for both sides.
    for (const issue of checked.error.issues)
      fail(issue.path[0] === 'tolerancePlusPct' ? 'tolerancePct' : String(issue.path[0] ?? 'nominal'), issue.message);
    return z.NEVER;
  }
  return checked.data;
});

export const emptyLotForm = (kind: LotKind = 'capacitor', watcherIds: string[] = []): LotFormValues => ({
  code: '',
  kind,
  nominal: '',
  tolerancePct: '',
  supplier: '',
  receivedOn: new Date().toISOString().slice(0, 10),
  expectedCount: '',
  secondQuantity: '',
  secondLimit: '',
  instrumentId: '',
  testFrequency: '',
  watcherIds,
  notes: '',
});
