// Installed parts in the slots of a job's wiring design (shared/circuit/slots.ts), and the values
// each assigned part brings to the prediction: a pot's fitted total resistance and fitted law, a
// capacitor's latest capacitance reading, a resistor's latest resistance reading, a pickup's coil fit
// (R, L, C and Rp when fitted). What a part lacks stays at the design's value and is said to.
import { and, desc, eq, isNull } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { fits, harnesses, readings } from '@server/db/schema';
import type { PartRow } from '@server/features/parts/repository';
import { getLayout, type LayoutDef } from '@shared/circuit/layouts';
import { designSlots, type DesignSlot } from '@shared/circuit/slots';
import { TAPER_LAWS, taperLaw, type TaperLaw } from '@shared/taper/law';

export type HarnessRow = typeof harnesses.$inferSelect;

/** The job's design with its layout and slots; null when the job has none (or its layout is unknown). */
export function designOf(db: DbLike, harnessId: number | null): { design: HarnessRow; layout: LayoutDef; slots: DesignSlot[] } | null {
  if (!harnessId) return null;
  const design = db.select().from(harnesses).where(eq(harnesses.id, harnessId)).get();
  const layout = design && getLayout(design.layout);
  if (!design || !layout) return null;
  return { design, layout, slots: designSlots(layout, design.options) };
}

export type SlotQuantity = keyof DesignSlot['values'];

/** One measured value a part brings to its slot. */
export interface MeasuredValue {
  quantity: SlotQuantity;
  /** The layout value key it replaces. */
  key: string;
  value: number | TaperLaw;
  /** Where it comes from, in words: "taper fit of 2026-06-03", "capacitance reading of 2026-06-03". */
  source: string;
}

export interface SlotValues {
  measured: MeasuredValue[];
  /** The slot's quantities the part has no measurement of (they keep the design's value). */
  notMeasured: SlotQuantity[];
}

/** The day of a measurement, ISO 8601 (UTC). */
const formatDate = (ms: number) => new Date(ms).toISOString().slice(0, 10);

const num = (v: unknown): number | undefined => (typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : undefined);

function currentFit(db: DbLike, partId: number, kind: 'taper' | 'coil') {
  return db
    .select()
    .from(fits)
    .where(and(eq(fits.partId, partId), eq(fits.kind, kind), isNull(fits.supersededAt)))
    .orderBy(desc(fits.id))
    .get();
}

function latestReading(db: DbLike, partId: number, quantity: string) {
  return db
    .select()
    .from(readings)
    .where(and(eq(readings.partId, partId), eq(readings.quantity, quantity)))
    .orderBy(desc(readings.id))
    .get();
}

/** The measured values of `part` for `slot`, and the quantities it has no measurement of. */
export function slotValues(db: DbLike, part: PartRow, slot: DesignSlot): SlotValues {
  const measured: MeasuredValue[] = [];
  const add = (quantity: SlotQuantity, value: number | TaperLaw | undefined, source: string) => {
    const key = slot.values[quantity];
    if (key && value !== undefined) measured.push({ quantity, key, value, source });
  };
  const fromReading = (quantity: 'resistance' | 'capacitance') => {
    const r = latestReading(db, part.id, quantity);
    if (r && num(r.value) !== undefined) add(quantity, r.value, `${quantity} reading of ${formatDate(r.takenAt)}`);
  };
  if (slot.accepts === 'pot') {
    const fit = currentFit(db, part.id, 'taper');
    const result = (fit?.result ?? {}) as { law?: unknown; m?: unknown; total?: unknown };
    const lawKind = TAPER_LAWS.find((l) => l === result.law);
    const m = typeof result.m === 'number' && result.m > 0 && result.m < 1 ? result.m : undefined;
    if (fit && num(result.total) !== undefined) add('resistance', result.total as number, `taper fit of ${formatDate(fit.createdAt)}`);
    else fromReading('resistance');
    if (fit && lawKind && (lawKind === 'linear' || m !== undefined))
      add('law', taperLaw(lawKind, m ?? 0.5), `taper fit of ${formatDate(fit.createdAt)}`);
  } else if (slot.accepts === 'pickup') {
    const fit = currentFit(db, part.id, 'coil');
    const result = (fit?.result ?? {}) as { R?: unknown; L?: unknown; C?: unknown; Rp?: unknown };
    if (fit && num(result.R) !== undefined && num(result.L) !== undefined && num(result.C) !== undefined) {
      const source = `coil fit of ${formatDate(fit.createdAt)}`;
      add('resistance', result.R as number, source);
      add('inductance', result.L as number, source);
      add('capacitance', result.C as number, source);
      add('lossResistance', num(result.Rp), source);
    } else {
      fromReading('resistance');
    }
  } else if (slot.accepts === 'capacitor') {
    fromReading('capacitance');
  } else {
    fromReading('resistance');
  }
  const have = new Set(measured.map((m) => m.quantity));
  // A pickup's loss resistance is optional in the model (absent unless given): not "missing" when unmeasured.
  const notMeasured = (Object.keys(slot.values) as SlotQuantity[]).filter((q) => !have.has(q) && q !== 'lossResistance');
  return { measured, notMeasured };
}
