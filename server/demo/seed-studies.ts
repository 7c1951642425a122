// The invented demo scenario, second half: lots of pots from two suppliers with rotation sweeps
// (for Compare), capacitor lots (one of 100,000 items, for the Lots screen), pickups with impedance
// sweeps, harness designs and jobs. All values are made up around typical trade figures
// — common practice (no published source).
import type Database from 'better-sqlite3';
import { eq } from 'drizzle-orm';
import type { Tx } from '@server/db/client';
import { recordReading } from '@server/features/readings/service';
import { fitAndStore } from '@server/features/sweeps/fit';
import { insertSweep } from '@server/features/sweeps/store';
import { setPartStatus } from '@server/features/parts/repository';
import { coilImpedance } from '@shared/analysis/coil';
import { taperLawValue, type TaperLawKind } from '@shared/taper/law';
import { harnesses, jobParts, jobs, lots, lotWatchers, parts, partStatusEvents } from '@server/db/schema';

interface Seeders {
  tx: Tx;
  sqlite: Database.Database;
  rand: () => number;
  users: { admin: string; qa: string; tech: string; viewer: string };
  suppliers: readonly [string, string];
}

/** Gaussian noise by Box–Muller, from the seeded PRNG. */
function gauss(rand: () => number): number {
  return Math.sqrt(-2 * Math.log(rand() + 1e-12)) * Math.cos(2 * Math.PI * rand());
}

function newPart(s: Seeders, values: typeof parts.$inferInsert) {
  const part = s.tx
    .insert(parts)
    .values({ createdBy: s.users.tech, ...values })
    .returning()
    .get();
  s.tx
    .insert(partStatusEvents)
    .values({ partId: part.id, toStatus: 'incoming', reason: values.lotId ? 'received with its lot' : 'created', userId: s.users.tech })
    .run();
  return part;
}

const refresh = (s: Seeders, id: number) => s.tx.select().from(parts).where(eq(parts.id, id)).get()!;

interface PotLotPlan {
  code: string;
  supplier: string;
  receivedOn: string;
  count: number;
  law: TaperLawKind;
  m: number;
  mSpread: number;
  totalSpreadPct: number;
  /** Items with a scratchy track (a dip in the sweep). */
  scratchy?: number[];
}

function seedPotLot(s: Seeders, plan: PotLotPlan): void {
  const nominal = 500e3;
  const lot = s.tx
    .insert(lots)
    .values({
      code: plan.code,
      kind: 'pot',
      quantity: 'resistance',
      nominal,
      tolerancePct: 20,
      supplier: plan.supplier,
      receivedOn: plan.receivedOn,
      expectedCount: plan.count,
      // One reading per item, inserted below in this transaction.
      readingCount: plan.count,
      secondQuantity: 'end-resistance',
      secondLimit: 500,
      createdBy: s.users.qa,
    })
    .returning()
    .get();
  s.tx.insert(lotWatchers).values({ lotId: lot.id, userId: s.users.qa }).run();
  const insertReading = s.sqlite.prepare('insert into lot_readings (lot_id, item, value, second_value, source_row) values (?, ?, ?, ?, ?)');
  for (let i = 1; i <= plan.count; i++) {
    const total = nominal * (1 + (plan.totalSpreadPct / 100) * gauss(s.rand) * 0.5);
    const endR = 150 + 250 * s.rand();
    const endR3 = 120 + 280 * s.rand();
    const m = Math.min(0.45, Math.max(0.04, plan.m + plan.mSpread * gauss(s.rand)));
    const item = String(i).padStart(3, '0');
    insertReading.run(lot.id, item, total, endR, i + 1);
    const part = newPart(s, {
      kind: 'pot',
      label: `${plan.code}-${item}`,
      nominal,
      tolerancePct: 20,
      taperClass: plan.law === 'linear' ? 'linear' : 'audio',
      taperM: plan.law === 'linear' ? 0.5 : 0.15,
      supplier: plan.supplier,
      lotId: lot.id,
      lotItem: item,
    });
    recordReading(s.tx, part, { quantity: 'resistance', value: total }, s.users.tech);
    const points = [];
    for (let deg = 0; deg <= 300; deg += 10) {
      const x = deg / 300;
      let y = taperLawValue(plan.law, m, x);
      if (plan.scratchy?.includes(i) && deg === 170) y -= 0.05;
      // Each half is the end resistance plus its share of the track, read with 0.3 % noise.
      const track = total - endR - endR3;
      const r1w = endR + track * y * (1 + 0.003 * gauss(s.rand));
      const rw3 = endR3 + track * (1 - y) * (1 + 0.003 * gauss(s.rand));
      points.push({ x, y: r1w, z: rw3 });
    }
    const sweep = insertSweep(
      s.tx,
      s.sqlite,
      {
        partId: part.id,
        kind: 'taper',
        attachmentId: null,
        columns: { rotation: 'Rotation (deg)', resistance: 'R1-W (kOhm)', resistanceW3: 'RW-3 (kOhm)' },
        createdBy: s.users.tech,
      },
      points,
    );
    fitAndStore(s.tx, refresh(s, part.id), sweep, s.users.tech);
  }
}

function seedCapacitorLot(
  s: Seeders,
  opts: {
    code: string;
    supplier: string;
    marking: string;
    nominal: number;
    tolerancePct: number;
    count: number;
    receivedOn: string;
    sdPct: number;
    biasPct: number;
  },
): number {
  const lot = s.tx
    .insert(lots)
    .values({
      code: opts.code,
      kind: 'capacitor',
      quantity: 'capacitance',
      nominal: opts.nominal,
      tolerancePct: opts.tolerancePct,
      marking: opts.marking,
      supplier: opts.supplier,
      receivedOn: opts.receivedOn,
      expectedCount: opts.count,
      // One reading per item, inserted below in this transaction.
      readingCount: opts.count,
      secondQuantity: 'dissipation',
      secondLimit: 0.01,
      createdBy: s.users.qa,
    })
    .returning()
    .get();
  s.tx
    .insert(lotWatchers)
    .values([
      { lotId: lot.id, userId: s.users.qa },
      { lotId: lot.id, userId: s.users.admin },
    ])
    .run();
  const insert = s.sqlite.prepare(
    'insert into lot_readings (lot_id, item, value, second_value, frequency, source_row) values (?, ?, ?, ?, 1000, ?)',
  );
  for (let i = 1; i <= opts.count; i++) {
    // A few parts from a second population (a reel change) make the outliers QA looks for.
    const shifted = i % 997 === 13;
    const dev = (opts.biasPct + opts.sdPct * gauss(s.rand) + (shifted ? 9 : 0)) / 100;
    const df = 0.0005 + 0.0008 * s.rand() + (i % 1499 === 7 ? 0.011 : 0);
    insert.run(lot.id, String(i).padStart(6, '0'), opts.nominal * (1 + dev), df, i + 1);
  }
  return lot.id;
}

function seedPickupSweeps(s: Seeders): void {
  const pickups = s.tx.select().from(parts).where(eq(parts.kind, 'pickup')).all().slice(0, 6);
  pickups.forEach((p, k) => {
    const humbucker = (p.nominal ?? 0) > 7e3;
    const truth = {
      R: (p.nominal ?? 6e3) * (1 + 0.03 * gauss(s.rand)),
      L: (humbucker ? 4.3 : 2.45) * (1 + 0.04 * gauss(s.rand)),
      C: (humbucker ? 125e-12 : 105e-12) * (1 + 0.05 * gauss(s.rand)),
      Rp: humbucker ? 450e3 : 300e3,
    };
    // One pickup with shorted turns: inductance and Q far below its siblings.
    if (k === 4) {
      truth.L *= 0.55;
      truth.Rp = 60e3;
    }
    const points = [];
    for (let i = 0; i < 240; i++) {
      const f = 20 * Math.pow(1000, i / 239);
      const z = coilImpedance(truth, f);
      const noise = 1 + 0.004 * gauss(s.rand);
      points.push({ x: f, y: z.re * noise, z: z.im * noise });
    }
    const sweep = insertSweep(
      s.tx,
      s.sqlite,
      {
        partId: p.id,
        kind: 'impedance',
        attachmentId: null,
        columns: { frequency: 'Freq (Hz)', re: 'Re Z (ohm)', im: 'Im Z (ohm)' },
        createdBy: s.users.tech,
      },
      points,
    );
    fitAndStore(s.tx, refresh(s, p.id), sweep, s.users.tech);
  });
}

function seedDesignsAndJobs(s: Seeders): void {
  const [keepTreble, darkNeck] = s.tx
    .insert(harnesses)
    .values([
      {
        name: 'Keeps its treble at low volume',
        preset: 'bleed-cap-parallel-r',
        layout: 'one-pickup',
        options: { bleed: 'cap-parallel-r' },
        values: { bleedC: 1.2e-9, bleedR: 150e3, cableLength: 4.5 },
        notes: 'For players who ride the volume knob.',
        ownerId: s.users.tech,
      },
      {
        name: 'Warm neck position, tone from the volume wiper',
        preset: 'interactive-tone',
        layout: 'one-pickup',
        options: { toneWiring: 'interactive' },
        values: { toneC: 15e-9, volumeR: 250e3, toneR: 250e3 },
        ownerId: s.users.tech,
      },
      {
        name: 'Tone knob with a usable bottom',
        preset: 'tone-floor-resistor',
        layout: 'one-pickup',
        options: { toneNetwork: 'floor-resistor' },
        values: { floorR: 8.2e3 },
        ownerId: s.users.qa,
      },
      {
        name: 'Two pickups, bridge reversed in the middle position',
        layout: 'two-pickups-3way',
        selector: 1,
        options: { phase: 'reversed', bleed: 'cap' },
        knobs: { 'neck.volume': 7 },
        values: { 'neck.bleedC': 680e-12, 'bridge.bleedC': 680e-12 },
        ownerId: s.users.tech,
      },
    ])
    .returning()
    .all();
  const job = s.tx
    .insert(jobs)
    .values({
      code: 'JOB-0001',
      customer: 'Customer A (invented)',
      customerEmail: 'customer.a@lugbook.test',
      instrument: 'Solid-body six-string, two single-coil-like pickups',
      harnessId: keepTreble!.id,
      notes: 'Volume drops too much treble; fit a bleed network.',
      createdBy: s.users.tech,
    })
    .returning()
    .get();
  s.tx
    .insert(jobs)
    .values({
      code: 'JOB-0002',
      customer: 'Customer B (invented)',
      instrument: 'Semi-hollow, two dual-coil pickups',
      harnessId: darkNeck!.id,
      status: 'done',
      createdBy: s.users.tech,
    })
    .run();
  const install = (label: string, position: string) => {
    const part = s.tx.select().from(parts).where(eq(parts.label, label)).get();
    if (!part || part.status !== 'passed') return;
    s.tx.insert(jobParts).values({ jobId: job.id, partId: part.id, position, installedBy: s.users.tech }).run();
    setPartStatus(s.tx, part, 'installed', `installed in ${job.code} (${position})`, s.users.tech);
  };
  install('POT-001', 'volume');
  install('POT-002', 'tone');
  install('CAP-003', 'tone capacitor');
}

export function seedStudies(s: Seeders): void {
  seedPotLot(s, {
    code: 'P-2609-A',
    supplier: s.suppliers[0],
    receivedOn: '2026-09-14',
    count: 10,
    law: 'audio',
    m: 0.19,
    mSpread: 0.015,
    totalSpreadPct: 8,
    scratchy: [4],
  });
  seedPotLot(s, {
    code: 'P-2611-A',
    supplier: s.suppliers[0],
    receivedOn: '2026-11-03',
    count: 12,
    law: 'audio',
    m: 0.15,
    mSpread: 0.01,
    totalSpreadPct: 6,
  });
  seedPotLot(s, {
    code: 'P-2611-B',
    supplier: s.suppliers[1],
    receivedOn: '2026-11-10',
    count: 12,
    law: 'two-segment',
    m: 0.11,
    mSpread: 0.02,
    totalSpreadPct: 12,
  });
  seedCapacitorLot(s, {
    code: 'C-2611-473J',
    supplier: s.suppliers[0],
    marking: '473J',
    nominal: 47e-9,
    tolerancePct: 5,
    count: 500,
    receivedOn: '2026-11-18',
    sdPct: 1.1,
    biasPct: -0.3,
  });
  seedCapacitorLot(s, {
    code: 'C-2611-223K-BULK',
    supplier: s.suppliers[1],
    marking: '223K',
    nominal: 22e-9,
    tolerancePct: 10,
    count: 100_000,
    receivedOn: '2026-11-24',
    sdPct: 3.2,
    biasPct: 1.5,
  });
  seedPickupSweeps(s);
  seedDesignsAndJobs(s);
}
