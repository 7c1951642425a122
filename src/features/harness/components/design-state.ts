// The design being edited: the whole instrument (layout, selector position, option choices, part
// values), the text in each value field as typed (with its error), and which values came from which
// measured part. The seven presets are quick starts: the one-pickup layout with their options.
// Plain functions and a reducer, so the screen's state changes are easy to follow and to test.
import {
  getLayout,
  PRESET_AS_LAYOUT,
  resolveLayoutConfig,
  type LayoutDef,
  type LayoutId,
  type LayoutValue,
  type LayoutValueDef,
} from '@shared/circuit/layouts';
import { isLoadId, LOAD_VALUES, loadValueKeys } from '@shared/circuit/loads';
import { HARNESS_PRESETS, type HarnessPresetId } from '@shared/circuit/presets';
import { lawMid, TAPER_LAW_LABEL, taperLaw, TYPICAL_MID, type TaperLaw, type TaperLawKind } from '@shared/taper/law';
import { formatValue } from '@shared/units/format';
import { tryParseValue } from '@shared/units/parse';

/** A measured part that supplied some of the values. */
export interface PartRef {
  partId: number;
  /** The part's label when known (a loaded design only has the id; the label is fetched). */
  label?: string;
  /** What was taken from it, in words: "coil fit", "taper fit", "capacitance reading". */
  source?: string;
}

export interface DesignState {
  layout: LayoutId;
  selector: number;
  /** Every option of the layout with its choice (defaults filled in). */
  options: Record<string, string>;
  /** Every value of the layout (defaults filled in; the optional loss resistance absent when none). */
  values: Record<string, LayoutValue>;
  /** Field text by value key; a law's mid-rotation figure under `${lawKey}.m`. */
  texts: Record<string, string>;
  errors: Record<string, string>;
  /** Value key → the measured part it came from. */
  refs: Record<string, PartRef>;
  /** The saved design this one was loaded from (an update goes to it). */
  loaded: { id: number; name: string; notes: string | null; ownerId: string | null } | null;
}

export const layoutOf = (s: Pick<DesignState, 'layout'>): LayoutDef => getLayout(s.layout)!;
export const defOf = (layout: LayoutDef, key: string): LayoutValueDef | undefined => layout.values.find((v) => v.key === key);
export const presetOf = (id: HarnessPresetId) => HARNESS_PRESETS.find((p) => p.id === id)!;
/** The last segment of a value key: `neck.toneC` → `toneC`. */
export const baseKey = (key: string) => key.slice(key.lastIndexOf('.') + 1);

const pct = (x: number) => String(Number((x * 100).toPrecision(4)));

/** Text of a value for its field: engineering notation with the unit. */
export function formatField(def: Pick<LayoutValueDef, 'quantity' | 'unit'>, value: LayoutValue | undefined): string {
  if (value === undefined || typeof value !== 'number') return '';
  switch (def.quantity) {
    case 'length':
      return `${Number(value.toPrecision(4))} m`;
    case 'capacitance-per-length':
      return `${formatValue(value, 'F', { digits: 4 })}/m`;
    default:
      // none: written in the unit's usual size (0 pF rather than 0 F)
      return value === 0 ? (def.unit === 'F' ? '0 pF' : `0 ${def.unit}`) : formatValue(value, def.unit, { digits: 4 });
  }
}

export type FieldParse = { ok: true; value: number | undefined } | { ok: false; error: string };

/** Reads a field's text. Length in metres; capacitance per metre in F/m (`100p`, `100 pF/m`). */
export function parseField(def: Pick<LayoutValueDef, 'quantity' | 'default' | 'range'>, text: string): FieldParse {
  const t = text.trim();
  const optional = def.default === null;
  if (t === '') return optional ? { ok: true, value: undefined } : { ok: false, error: 'Give a value.' };
  const zeroOk = def.range === 'non-negative';
  let r: { ok: true; value: number } | { ok: false; error: string };
  switch (def.quantity) {
    case 'length': {
      // A bare "m" would be read as milli by the parser; here the unit is always metres.
      const n = t.replace(/\s*m(etres?)?$/i, '');
      const p = tryParseValue(n, 'ratio');
      r = p.ok ? { ok: true, value: p.value } : { ok: false, error: `"${text}" is not a length: give metres, e.g. 3 or 4.5 m.` };
      if (r.ok && !((zeroOk ? r.value >= 0 : r.value > 0) && r.value <= 100))
        r = { ok: false, error: zeroOk ? 'A cable from 0 (none) up to 100 m.' : 'A cable from more than 0 up to 100 m.' };
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
      // "0" alone has no unit to read; where zero is allowed it means none
      if (zeroOk && /^0+([.,]0*)?\s*[a-zA-ZΩµ]*$/.test(t)) return { ok: true, value: 0 };
      const p = tryParseValue(t, def.quantity);
      r = p.ok ? { ok: true, value: p.value } : { ok: false, error: p.error };
      if (r.ok && !(zeroOk ? r.value >= 0 : r.value > 0))
        r = { ok: false, error: zeroOk ? 'Must not be negative.' : 'Must be more than zero.' };
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

function textsOf(layout: LayoutDef, values: Record<string, LayoutValue>, keys?: readonly string[]): Record<string, string> {
  const texts: Record<string, string> = {};
  for (const def of layout.values) {
    if (keys && !keys.includes(def.key)) continue;
    if (def.quantity === 'law') texts[`${def.key}.m`] = pct(lawMid(values[def.key] as TaperLaw));
    else texts[def.key] = formatField(def, values[def.key]);
  }
  return texts;
}

/** The options a layout starts with, or the given ones over them. */
function filledOptions(layout: LayoutDef, options: Record<string, string> = {}): Record<string, string> {
  const out: Record<string, string> = {};
  for (const o of layout.options) out[o.id] = o.choices.some((c) => c.id === options[o.id]) ? options[o.id]! : o.choices[0]!.id;
  return out;
}

/** A fresh design of the layout at its typical values (or the given ones over them). */
export function initialDesign(
  layoutId: LayoutId = 'one-pickup',
  from: { selector?: number; options?: Record<string, string>; values?: Record<string, unknown> } = {},
): DesignState {
  const layout = getLayout(layoutId)!;
  const known = Object.fromEntries(Object.entries(from.values ?? {}).filter(([k]) => defOf(layout, k)));
  const { config } = resolveLayoutConfig(layout, { values: known });
  const selector = Math.min(Math.max(0, from.selector ?? 0), layout.selector.positions.length - 1);
  return {
    layout: layoutId,
    selector,
    options: filledOptions(layout, from.options),
    values: config.values,
    texts: textsOf(layout, config.values),
    errors: {},
    refs: {},
    loaded: null,
  };
}

/** A quick start: the one-pickup layout with a preset's options. */
export const presetDesign = (preset: HarnessPresetId): DesignState =>
  initialDesign('one-pickup', { options: PRESET_AS_LAYOUT[preset] as Record<string, string> });

/** The preset whose network the design is (one-pickup layout into an amplifier), or null. */
export function quickStartOf(s: Pick<DesignState, 'layout' | 'options'>): HarnessPresetId | null {
  if (s.layout !== 'one-pickup') return null;
  const layout = getLayout('one-pickup')!;
  const found = HARNESS_PRESETS.find((p) => {
    const o = filledOptions(layout, PRESET_AS_LAYOUT[p.id] as Record<string, string>);
    return layout.options.every((d) => o[d.id] === s.options[d.id]);
  });
  return found?.id ?? null;
}

export type DesignAction =
  | { type: 'layout'; layout: LayoutId }
  /** A preset as a quick start: the one-pickup layout with its options (values kept when already one-pickup). */
  | { type: 'quick-start'; preset: HarnessPresetId }
  | { type: 'option'; id: string; choice: string }
  | { type: 'selector'; index: number }
  | { type: 'text'; key: string; text: string }
  | { type: 'law-kind'; key: string; kind: TaperLawKind }
  | { type: 'law-mid'; key: string; text: string }
  /** Values taken together (a typical pickup, a measured part, a finder candidate); `ref` marks where they came from. */
  | { type: 'apply'; values: Record<string, LayoutValue>; ref?: PartRef; clear?: string[]; options?: Record<string, string> }
  | { type: 'detach'; keys: string[] }
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
  const layout = layoutOf(state);
  switch (action.type) {
    case 'layout':
      return action.layout === state.layout ? state : { ...initialDesign(action.layout), loaded: state.loaded };
    case 'quick-start': {
      const options = filledOptions(getLayout('one-pickup')!, PRESET_AS_LAYOUT[action.preset] as Record<string, string>);
      if (state.layout !== 'one-pickup') return { ...presetDesign(action.preset), loaded: state.loaded };
      return { ...state, options };
    }
    case 'option':
      return { ...state, options: { ...state.options, [action.id]: action.choice } };
    case 'selector':
      return { ...state, selector: action.index };
    case 'text': {
      const def = defOf(layout, action.key);
      if (!def) return state;
      const parsed = parseField(def, action.text);
      const texts = { ...state.texts, [action.key]: action.text };
      // A typed value is no longer the measured part's.
      const refs = without(state.refs, [action.key]);
      if (!parsed.ok) return { ...state, texts, refs, errors: { ...state.errors, [action.key]: parsed.error } };
      const values = { ...state.values };
      if (parsed.value === undefined) delete values[action.key];
      else values[action.key] = parsed.value;
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
      const law = taperLaw((state.values[action.key] as TaperLaw).kind, mid.value);
      return { ...state, texts, refs, values: { ...state.values, [action.key]: law }, errors: without(state.errors, [midKey]) };
    }
    case 'apply': {
      const values = { ...state.values, ...action.values };
      for (const k of action.clear ?? []) delete values[k];
      const keys = [...Object.keys(action.values), ...(action.clear ?? [])];
      const fresh = textsOf(layout, values, keys);
      const touched = keys.flatMap((k) => [k, `${k}.m`]);
      let refs = without(state.refs, keys);
      if (action.ref) refs = { ...refs, ...Object.fromEntries(keys.map((k) => [k, action.ref!])) };
      return {
        ...state,
        options: action.options ? { ...state.options, ...action.options } : state.options,
        values,
        texts: { ...state.texts, ...fresh },
        errors: without(state.errors, touched),
        refs,
      };
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

/** A saved design as the server sends it (whole-instrument shape). */
export interface SavedDesignLike {
  id: number;
  name: string;
  notes: string | null;
  ownerId: string | null;
  layout: string;
  selector: number;
  options: Record<string, string>;
  knobs: Record<string, number> | null;
  values: Record<string, unknown>;
  partRefs: Record<string, number> | null;
}

/** The state for a saved design: its values over the defaults, its part references by id. */
export function designFromSaved(saved: SavedDesignLike): DesignState {
  const layoutId = (getLayout(saved.layout)?.id ?? 'one-pickup') as LayoutId;
  const base = initialDesign(layoutId, { selector: saved.selector, options: saved.options, values: saved.values });
  const refs: DesignState['refs'] = {};
  for (const [k, id] of Object.entries(saved.partRefs ?? {})) if (defOf(layoutOf(base), k)) refs[k] = { partId: id };
  return { ...base, refs, loaded: { id: saved.id, name: saved.name, notes: saved.notes, ownerId: saved.ownerId } };
}

/** partRefs for saving: value key → part id (only the values the design uses). */
export function partRefsOf(state: DesignState): Record<string, number> {
  const used = new Set(usedKeys(state));
  return Object.fromEntries(Object.entries(state.refs).flatMap(([k, r]) => (used.has(k) ? [[k, r.partId]] : [])));
}

const LOAD_KEYS = new Set(LOAD_VALUES.map((d) => d.key));

/** Whether the design's options make use of a value (a bleed resistor only with a bleed that has one, …). */
export function isUsed(state: Pick<DesignState, 'options'>, key: string): boolean {
  const o = state.options;
  if (LOAD_KEYS.has(key)) return loadValueKeys(isLoadId(o.load) ? o.load : 'amp').includes(key);
  if (key.startsWith('south.') && o.coils === 'single') return false;
  switch (baseKey(key)) {
    case 'bleedC':
      return (o.bleed ?? 'none') !== 'none';
    case 'bleedR':
      return o.bleed === 'cap-parallel-r' || o.bleed === 'cap-series-r';
    case 'floorR':
      return o.toneNetwork === 'floor-resistor' || o.toneNetwork === 'floor-and-second-cap';
    case 'secondC':
      return o.toneNetwork === 'second-cap' || o.toneNetwork === 'floor-and-second-cap';
    default:
      return true;
  }
}

/** The value keys the design uses, in the layout's order. */
export function usedKeys(state: Pick<DesignState, 'layout' | 'options'>): string[] {
  return layoutOf(state)
    .values.map((d) => d.key)
    .filter((k) => isUsed(state, k));
}

/** Errors of the fields the design uses (others do not stop a save or a computation). */
export function activeErrors(state: DesignState): string[] {
  const keys = new Set(usedKeys(state).flatMap((k) => [k, `${k}.m`]));
  return Object.keys(state.errors).filter((k) => keys.has(k));
}

/** The values the design uses, for saving and comparing (the rest stay at their defaults). */
export function usedValues(state: Pick<DesignState, 'layout' | 'options' | 'values'>): Record<string, LayoutValue> {
  const out: Record<string, LayoutValue> = {};
  for (const k of usedKeys(state)) {
    const v = state.values[k];
    if (v !== undefined) out[k] = v;
  }
  return out;
}

/** A value in words for tables: "22 nF", "Audio, 15 % at mid-rotation". */
export function describeValue(def: LayoutValueDef, values: Record<string, LayoutValue>): string {
  if (def.quantity === 'law') {
    const law = values[def.key] as TaperLaw;
    return law.kind === 'linear' ? TAPER_LAW_LABEL.linear : `${TAPER_LAW_LABEL[law.kind]}, ${pct(lawMid(law))} % at mid-rotation`;
  }
  const v = values[def.key];
  if (v === undefined) return 'none';
  return formatField(def, v);
}

/** The whole instrument of a design, as the engine, Listen and the routes take it. */
export function instrumentOf(s: Pick<DesignState, 'layout' | 'selector' | 'options' | 'values'>, knobs: Record<string, number>) {
  return { layout: s.layout, selector: s.selector, options: s.options, knobs, values: usedValues(s) as Record<string, number> };
}

export const sameValue = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);
