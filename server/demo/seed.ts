// The invented demo scenario: a small repair workshop with a parts bench and a harness line.
// Every name here is made up; values are typical of the trade — common practice (no published source).
import { sql } from 'drizzle-orm';
import { hashPassword } from '@server/auth/password';
import { newId } from '@server/auth/tokens';
import type { AppContext } from '@server/context';
import { recordReading } from '@server/features/readings/service';
import type { ReadingQuantity } from '@shared/schemas/bench';
import { instruments, parts, partStatusEvents, toleranceProfiles, users } from '@server/db/schema';
import { seedStudies } from './seed-studies';
import { seededRandom } from '@shared/random/seeded';

export const DEMO_USERS = [
  { email: 'admin@lugbook.test', name: 'Noor Admin', role: 'admin' },
  { email: 'qa@lugbook.test', name: 'Quinn Inspector', role: 'qa' },
  { email: 'tech@lugbook.test', name: 'Tam Bench', role: 'tech' },
  { email: 'viewer@lugbook.test', name: 'Vic Reader', role: 'viewer' },
] as const;

export const DEMO_SUPPLIERS = ['Alvane Parts Co.', 'Brosk Electric Supply'] as const;

/** Seeds the demo into an empty database; returns false when there are users already. */
/** `studies: false` leaves out the lots, sweeps, designs and jobs (the API tests need only the bench). */
export async function seedDemo(ctx: AppContext, opts: { password: string; studies?: boolean }): Promise<boolean> {
  const { db } = ctx;
  const count =
    db
      .select({ n: sql<number>`count(*)` })
      .from(users)
      .get()?.n ?? 0;
  if (count > 0) return false;

  const passwordHash = await hashPassword(opts.password);
  const userIds = Object.fromEntries(DEMO_USERS.map((u) => [u.role, newId()])) as Record<(typeof DEMO_USERS)[number]['role'], string>;
  const tech = userIds.tech;
  const rand = seededRandom(2026);

  db.transaction((tx) => {
    for (const u of DEMO_USERS)
      tx.insert(users).values({ id: userIds[u.role], email: u.email, name: u.name, role: u.role, passwordHash }).run();

    tx.insert(toleranceProfiles)
      .values([
        {
          name: 'Pots, audio taper',
          kind: 'pot',
          tolerancePct: 20,
          rules: { law: 'audio-any', mMin: 0.08, mMax: 0.2, maxEndResistance: 500 },
          createdBy: userIds.qa,
        },
        {
          name: 'Pots, linear taper',
          kind: 'pot',
          tolerancePct: 20,
          rules: { law: 'linear', mMin: 0.4, mMax: 0.6, maxEndResistance: 500 },
          createdBy: userIds.qa,
        },
        {
          name: 'Film capacitors',
          kind: 'capacitor',
          tolerancePct: 10,
          rules: { dissipationMax: 0.01, dissipationFrequency: 1000 },
          createdBy: userIds.qa,
        },
        { name: 'Resistors, 1 %', kind: 'resistor', tolerancePct: 1, rules: {}, createdBy: userIds.qa },
        { name: 'Pickups, DC resistance', kind: 'pickup', tolerancePct: 8, rules: { inductanceTolerancePct: 10 }, createdBy: userIds.qa },
      ])
      .run();

    const [meter, lcr, spareMeter] = tx
      .insert(instruments)
      .values([
        {
          name: 'Bench multimeter A',
          kind: 'multimeter',
          serial: 'MM-0412',
          accuracy: { resistance: { pctOfReading: 0.5, counts: 2, resolution: 100 } },
          calibrationDue: '2027-06-30',
        },
        {
          name: 'LCR meter 1',
          kind: 'lcr-meter',
          serial: 'LCR-1187',
          accuracy: {
            capacitance: { pctOfReading: 0.3, counts: 3, resolution: 1e-12 },
            inductance: { pctOfReading: 0.3, counts: 3, resolution: 1e-3 },
            resistance: { pctOfReading: 0.3, counts: 3, resolution: 0.1 },
          },
          calibrationDue: '2027-02-15',
        },
        {
          name: 'Handheld meter (spare)',
          kind: 'multimeter',
          serial: 'MM-0077',
          accuracy: { resistance: { pctOfReading: 1, counts: 3, resolution: 100 } },
          calibrationDue: '2026-09-01',
          notes: 'Calibration overdue: readings taken with it are marked.',
        },
      ])
      .returning({ id: instruments.id })
      .all();

    const made: {
      kind: 'pot' | 'capacitor' | 'resistor' | 'pickup';
      label: string;
      nominal: number;
      tolerancePct: number;
      extra?: Record<string, unknown>;
    }[] = [];
    for (let i = 1; i <= 24; i++) {
      const nominal = i % 3 === 0 ? 250e3 : 500e3;
      const linear = i % 6 === 0;
      made.push({
        kind: 'pot',
        label: `POT-${String(i).padStart(3, '0')}`,
        nominal,
        tolerancePct: 20,
        extra: { taperClass: linear ? 'linear' : 'audio', taperM: linear ? 0.5 : 0.15, supplier: DEMO_SUPPLIERS[i % 2] },
      });
    }
    const capValues = [22e-9, 47e-9, 15e-9, 10e-9, 100e-9, 1e-9];
    for (let i = 1; i <= 24; i++) {
      made.push({
        kind: 'capacitor',
        label: `CAP-${String(i).padStart(3, '0')}`,
        nominal: capValues[i % capValues.length]!,
        tolerancePct: 10,
        extra: { supplier: DEMO_SUPPLIERS[(i + 1) % 2] },
      });
    }
    const resValues = [150e3, 100e3, 220e3, 10e3, 1e6];
    for (let i = 1; i <= 12; i++)
      made.push({
        kind: 'resistor',
        label: `RES-${String(i).padStart(3, '0')}`,
        nominal: resValues[i % resValues.length]!,
        tolerancePct: 1,
      });
    for (let i = 1; i <= 12; i++) {
      const humbucker = i % 2 === 0;
      made.push({
        kind: 'pickup',
        label: `PU-${String(i).padStart(3, '0')}`,
        nominal: humbucker ? 8.2e3 : 6.1e3,
        tolerancePct: 8,
        extra: { notes: humbucker ? 'Dual-coil, bridge position' : 'Single-coil, neck position' },
      });
    }
    for (const m of made) {
      const part = tx
        .insert(parts)
        .values({ kind: m.kind, label: m.label, nominal: m.nominal, tolerancePct: m.tolerancePct, createdBy: tech, ...(m.extra ?? {}) })
        .returning({ id: parts.id })
        .get();
      tx.insert(partStatusEvents).values({ partId: part.id, toStatus: 'incoming', reason: 'created', userId: tech }).run();
      // Most parts sit near nominal; every ninth is off by more than its tolerance.
      const spread = (m.tolerancePct / 100) * (made.indexOf(m) % 9 === 4 ? 1.4 : 0.45);
      const value = m.nominal * (1 + spread * (2 * rand() - 1));
      const fresh = tx
        .select()
        .from(parts)
        .where(sql`${parts.id} = ${part.id}`)
        .get()!;
      const quantity: ReadingQuantity = m.kind === 'capacitor' ? 'capacitance' : 'resistance';
      const instrumentId = m.kind === 'capacitor' ? lcr!.id : made.indexOf(m) % 11 === 3 ? spareMeter!.id : meter!.id;
      recordReading(tx, fresh, { quantity, value, instrumentId, frequency: m.kind === 'capacitor' ? 1000 : null }, tech);
      if (m.kind === 'capacitor') {
        const df = 0.0006 + 0.0012 * rand() + (made.indexOf(m) % 10 === 7 ? 0.012 : 0);
        recordReading(
          tx,
          tx
            .select()
            .from(parts)
            .where(sql`${parts.id} = ${part.id}`)
            .get()!,
          { quantity: 'dissipation', value: df, instrumentId: lcr!.id, frequency: 1000 },
          tech,
        );
      }
      if (m.kind === 'pickup') {
        const inductance = (m.nominal > 7e3 ? 4.4 : 2.5) * (1 + 0.06 * (2 * rand() - 1));
        recordReading(
          tx,
          tx
            .select()
            .from(parts)
            .where(sql`${parts.id} = ${part.id}`)
            .get()!,
          { quantity: 'inductance', value: inductance, instrumentId: lcr!.id, frequency: 1000 },
          tech,
        );
      }
    }
    if (opts.studies !== false) seedStudies({ tx, sqlite: ctx.sqlite, rand, users: userIds, suppliers: DEMO_SUPPLIERS });
  });
  return true;
}
