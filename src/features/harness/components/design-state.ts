// The design being edited: the preset, the part values (the last valid value of every field), the
// text in each field as typed (with its error), and which values came from which measured part.
// Plain functions and a reducer, so the screen's state changes are easy to follow and to test.
import {
  DEFAULT_HARNESS_VALUES,
  HARNESS_PRESETS,
  HARNESS_VALUE_FIELDS,
  type HarnessPresetId,
  type HarnessValueField,
  type HarnessValues,
} from '@shared/circuit/presets';
import { lawMid, TAPER_LAW_LABEL, taperLaw, TYPICAL_MID, type TaperLaw, type TaperLawKind } from '@shared/taper/law';
import { formatValue } from '@shared/units/format';
import { tryParseValue } from '@shared/units/parse';

export type LawKey = 'volumeLaw' | 'toneLaw';
export type NumericKey = Exclude<keyof HarnessValues, LawKey>;

/** A measured part that supplied some of the values. */
export interface PartRef {
  partId: number;
  /** The part's label when known (a loaded design only has the id; the label is fetched). */
  label?: string;
  /** What was taken from it, in words: "coil fit", "taper fit". */
  source?: string;
}

export interface DesignState {
  preset: HarnessPresetId;
  values: HarnessValues;
  /** Field text by value key; a law's mid-rotation figure under `${lawKey}.m`. */
  texts: Record<string, string>;
  errors: Record<string, string>;
  /** Value key → the measured part it came from. */
  refs: Partial<Record<keyof HarnessValues, PartRef>>;
  /** The saved design this one was loaded from (an update goes to it). */
  loaded: { id: number; name: string; notes: string | null; ownerId: string | null } | null;
}

export const fieldsFor = (preset: HarnessPresetId): HarnessValueField[] => HARNESS_VALUE_FIELDS.filter((f) => f.presets.includes(preset));
export const fieldOf = (key: keyof HarnessValues): HarnessValueField => HARNESS_VALUE_FIELDS.find((f) => f.key === key)!;
export const presetOf = (id: HarnessPresetId) => HARNESS_PRESETS.find((p) => p.id === id)!;

const pct = (x: number) => String(Number((x * 100).toPrecision(4)));

/** Text of a value for its field: engineering notation with the unit. */
export function formatField(field: HarnessValueField, value: number | undefined): string {
  if (value === undefined) return '';
  switch (field.quantity) {
    case 'length':
      return `${Number(value.toPrecision(4))} m`;
    case 'capacitance-per-length':
      return `${formatValue(value, 'F', { digits: 4 })}/m`;
    default:
      return formatValue(value, field.unit, { digits: 4 });
  }
}

export type FieldParse = { ok: true; value: number | undefined } | { ok: false; error: string };

/** Reads a field's text. Length in metres; capacitance per metre in F/m (`100p`, `100 pF/m`). */
export function parseField(field: HarnessValueField, text: string): FieldParse {
  const t = text.trim();
  if (t === '') return field.optional ? { ok: true, value: undefined } : { ok: false, error: 'Give a value.' };
  let r: { ok: true; value: number } | { ok: false; error: string };
  switch (field.quantity) {
    case 'length': {
      // A bare "m" would be read as milli by the parser; here the unit is always metres.
      const n = t.replace(/\s*m(etres?)?$/i, '');
      const p = tryParseValue(n, 'ratio');
      r = p.ok ? { ok: true, value: p.value } : { ok: false, error: `"${text}" is not a length: give metres, e.g. 3 or 4.5 m.` };
      if (r.ok && !(r.value > 0 && r.value <= 100)) r = { ok: false, error: 'A cable from more than 0 up to 100 m.' };
      break;
    }
    case 'capacitance-per-length': {
      const p = tryParseValue(t.replace(/\s*\/\s*m$/i, ''), 'capacitance');
      r = p.ok ? { ok: true, value: p.value } : { ok: false, error: p.error };
      if (r.ok && !(r.value > 0)) r = { ok: false, error: 'Must be more than zero (about 100 pF/m is usual).' };
      break;
    }
    case 'law':
      return { ok: false, error: 'not a number field' };
    default: {
      const p = tryParseValue(t, field.quantity);
      r = p.ok ? { ok: true, value: p.value } : { ok: false, error: p.error };
      if (r.ok && !(r.value > 0)) r = { ok: false, error: 'Must be more than zero.' };
    }
  }
  return r;
}

/** The mid-rotation figure in percent: "15", "15 %", "15%". */
export function parseMid(text: string): { ok: true; value: number } | { ok: false; error: string } {
  const n = Number(text.trim().replace(/\s*%$/, '').replace(',', '.'));
  if (text.trim() === '' || !Number.isFinite(n)) return { ok: false, error: 'Give the percentage at mid-rotation, e.g. 15.' };
  if (!(n > 0 && n < 100)) return { ok: false, error: 'Between 0 and 100 % (not either end).' };
  return { ok: true, value: n / 100 };
}

const NUMERIC_FIELDS = HARNESS_VALUE_FIELDS.filter((f) => f.quantity !== 'law');

function textsOf(values: HarnessValues): Record<string, string> {
  const texts: Record<string, string> = {};
  for (const f of NUMERIC_FIELDS) texts[f.key] = formatField(f, values[f.key] as number | undefined);
  texts['volumeLaw.m'] = pct(lawMid(values.volumeLaw));
  texts['toneLaw.m'] = pct(lawMid(values.toneLaw));
  return texts;
}

export function initialDesign(preset: HarnessPresetId = 'independent-tone', values: HarnessValues = DEFAULT_HARNESS_VALUES): DesignState {
  return { preset, values: { ...values }, texts: textsOf(values), errors: {}, refs: {}, loaded: null };
}

export type DesignAction =
  | { type: 'preset'; preset: HarnessPresetId }
  | { type: 'text'; key: NumericKey; text: string }
  | { type: 'law-kind'; key: LawKey; kind: TaperLawKind }
  | { type: 'law-mid'; key: LawKey; text: string }
  /** Values taken together (a typical pickup, a measured part); `ref` marks where they came from. */
  | { type: 'apply'; values: Partial<HarnessValues>; ref?: PartRef; clearRp?: boolean }
  | { type: 'detach'; keys: (keyof HarnessValues)[] }
  | { type: 'replace'; state: DesignState }
  /** The design was saved: later saves update that record. */
  | { type: 'saved'; loaded: NonNullable<DesignState['loaded']> }
  /** A saved design was deleted: if the editor came from it, it no longer has a record. */
  | { type: 'deleted'; id: number };

function without<T extends object>(o: T, keys: readonly PropertyKey[]): T {
  const copy = { ...o };
  for (const k of keys) delete (copy as Record<PropertyKey, unknown>)[k];
  return copy;
}

export function designReducer(state: DesignState, action: DesignAction): DesignState {
  switch (action.type) {
    case 'preset':
      return { ...state, preset: action.preset };
    case 'text': {
      const field = fieldOf(action.key);
      const parsed = parseField(field, action.text);
      const texts = { ...state.texts, [action.key]: action.text };
      // A typed value is no longer the measured part's.
      const refs = without(state.refs, [action.key]);
      if (!parsed.ok) return { ...state, texts, refs, errors: { ...state.errors, [action.key]: parsed.error } };
      const values = { ...state.values };
      if (parsed.value === undefined) delete values.pickupRp;
      else (values as Record<string, unknown>)[action.key] = parsed.value;
      return { ...state, texts, refs, values, errors: without(state.errors, [action.key]) };
    }
    case 'law-kind': {
      const midKey = `${action.key}.m`;
      const mid = parseMid(state.texts[midKey] ?? '');
      // Switching to a curved law from linear starts at the law's usual mid-rotation figure.
      const m = action.kind === 'linear' ? 0.5 : mid.ok && mid.value !== 0.5 ? mid.value : TYPICAL_MID[action.kind];
      const law = taperLaw(action.kind, m);
      return {
        ...state,
        values: { ...state.values, [action.key]: law },
        texts: { ...state.texts, [midKey]: pct(lawMid(law)) },
        errors: without(state.errors, [midKey]),
        refs: without(state.refs, [action.key]),
      };
    }
    case 'law-mid': {
      const midKey = `${action.key}.m`;
      const texts = { ...state.texts, [midKey]: action.text };
      const refs = without(state.refs, [action.key]);
      const mid = parseMid(action.text);
      if (!mid.ok) return { ...state, texts, refs, errors: { ...state.errors, [midKey]: mid.error } };
      const law = taperLaw(state.values[action.key].kind, mid.value);
      return { ...state, texts, refs, values: { ...state.values, [action.key]: law }, errors: without(state.errors, [midKey]) };
    }
    case 'apply': {
      const values = { ...state.values, ...action.values };
      if (action.clearRp) delete values.pickupRp;
      const keys = Object.keys(action.values) as (keyof HarnessValues)[];
      if (action.clearRp) keys.push('pickupRp');
      const all = textsOf(values);
      const texts = { ...state.texts };
      const touched: string[] = [];
      for (const k of keys) {
        texts[k] = all[k] ?? '';
        touched.push(k);
        if (k === 'volumeLaw' || k === 'toneLaw') {
          texts[`${k}.m`] = all[`${k}.m`] ?? '';
          touched.push(`${k}.m`);
        }
      }
      let refs = without(state.refs, keys);
      if (action.ref) refs = { ...refs, ...Object.fromEntries(keys.map((k) => [k, action.ref])) };
      return { ...state, values, texts, errors: without(state.errors, touched), refs };
    }
    case 'detach':
      return { ...state, refs: without(state.refs, action.keys) };
    case 'replace':
      return action.state;
    case 'saved':
      return { ...state, loaded: action.loaded };
    case 'deleted':
      return state.loaded?.id === action.id ? { ...state, loaded: null } : state;
  }
}

/** The state for a saved design: its values over the defaults, its part references by id. */
export function designFromSaved(saved: {
  id: number;
  name: string;
  notes: string | null;
  ownerId: string | null;
  preset: HarnessPresetId;
  /** A preset design's values use the one-pickup layout's flat keys. */
  values: Record<string, unknown>;
  partRefs: Record<string, number> | null;
}): DesignState {
  const values: HarnessValues = { ...DEFAULT_HARNESS_VALUES, ...(saved.values as Partial<HarnessValues>) };
  if (saved.values.pickupRp === undefined) delete values.pickupRp;
  const refs: DesignState['refs'] = {};
  for (const [k, id] of Object.entries(saved.partRefs ?? {})) {
    if (HARNESS_VALUE_FIELDS.some((f) => f.key === k)) refs[k as keyof HarnessValues] = { partId: id };
  }
  return {
    ...initialDesign(saved.preset, values),
    refs,
    loaded: { id: saved.id, name: saved.name, notes: saved.notes, ownerId: saved.ownerId },
  };
}

/** partRefs for saving: value key → part id. */
export function partRefsOf(state: DesignState): Record<string, number> {
  return Object.fromEntries(Object.entries(state.refs).map(([k, r]) => [k, r!.partId]));
}

/** Errors of the fields the preset uses (others do not stop a save or a computation). */
export function activeErrors(state: DesignState): string[] {
  const keys = new Set<string>(fieldsFor(state.preset).flatMap((f) => (f.quantity === 'law' ? [`${f.key}.m`] : [f.key])));
  return Object.keys(state.errors).filter((k) => keys.has(k));
}

/** The values the preset uses, for saving and comparing (the rest stay at their defaults). */
export function usedValues(preset: HarnessPresetId, values: HarnessValues): Partial<HarnessValues> {
  const out: Partial<HarnessValues> = {};
  for (const f of fieldsFor(preset)) {
    const v = values[f.key];
    if (v !== undefined) (out as Record<string, unknown>)[f.key] = v;
  }
  return out;
}

/** A value in words for tables: "22 nF", "Audio, 15 % at mid-rotation". */
export function describeValue(key: keyof HarnessValues, values: HarnessValues): string {
  const field = fieldOf(key);
  if (field.quantity === 'law') {
    const law = values[key] as TaperLaw;
    return law.kind === 'linear' ? TAPER_LAW_LABEL.linear : `${TAPER_LAW_LABEL[law.kind]}, ${pct(lawMid(law))} % at mid-rotation`;
  }
  const v = values[key] as number | undefined;
  if (v === undefined) return 'none';
  return field.quantity === 'length'
    ? `${Number(v.toPrecision(4))} m`
    : field.quantity === 'capacitance-per-length'
      ? `${formatValue(v, 'F')}/m`
      : formatValue(v, field.unit);
}

export const sameValue = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);
