// The measured parts a saved design names (partRefs: value key → part id) are checked before it is
// stored: the key is a value of the design's layout, the part exists, it is of the kind the slot
// takes (part-slots.ts), and a capacitor or resistor has the reading its value comes from. A
// problem is a 422 naming `partRefs.<key>`.
import { and, desc, eq } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { readings } from '@server/db/schema';
import { findPart } from '@server/features/parts/repository';
import { unprocessable } from '@server/http/errors';
import type { LayoutDef } from '@shared/circuit/layouts';
import { slotPartKind } from '@shared/circuit/slots';

const READING_OF = { capacitor: 'capacitance', resistor: 'resistance' } as const;

export function checkPartRefs(db: DbLike, layout: LayoutDef, partRefs: Record<string, number> | null | undefined): void {
  for (const [key, partId] of Object.entries(partRefs ?? {})) {
    const field = `partRefs.${key}`;
    if (!layout.values.some((v) => v.key === key))
      throw unprocessable(`This layout has no value "${key}" for a part to supply.`, { [field]: 'Not a value of this layout.' });
    const kind = slotPartKind(key);
    if (!kind) throw unprocessable(`No measured part supplies "${key}".`, { [field]: 'Type this value; no part supplies it.' });
    const part = findPart(db, partId);
    if (!part) throw unprocessable(`Part ${partId} does not exist.`, { [field]: 'No such part.' });
    if (part.kind !== kind)
      throw unprocessable(`${part.label} is a ${part.kind}; "${key}" takes a ${kind}.`, { [field]: `Choose a ${kind}.` });
    if (kind === 'capacitor' || kind === 'resistor') {
      const reading = db
        .select({ id: readings.id })
        .from(readings)
        .where(and(eq(readings.partId, partId), eq(readings.quantity, READING_OF[kind])))
        .orderBy(desc(readings.id))
        .get();
      if (!reading)
        throw unprocessable(`${part.label} has no ${READING_OF[kind]} reading to take "${key}" from.`, {
          [field]: `Measure its ${READING_OF[kind]} first.`,
        });
    }
  }
}
