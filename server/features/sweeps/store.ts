// Storing a sweep's points: one place for the stored form (see the sweep_points column comment).
import type Database from 'better-sqlite3';
import type { DbLike } from '@server/db/client';
import { sweeps } from '@server/db/schema';
import type { CoilPoint } from '@shared/analysis/coil';
import type { TaperPoint } from '@shared/analysis/taper';
import type { SweepKind } from '@shared/schemas/sweeps';
import type { SweepRow } from './fit';

export interface StoredPoint {
  x: number;
  y: number;
  z: number | null;
  /** Taper: R13 measured beside the reading; null or absent when not measured. */
  total?: number | null;
}

/**
 * Points as stored: taper x = rotation fraction, y = R1W, z = RW3, total = R13; impedance x = f,
 * y = Re Z, z = Im Z. The rotation is converted to a fraction here, once; the fit takes these
 * same points (fitInput), whether just parsed or read back from the database.
 */
export function toStoredPoints(
  kind: SweepKind,
  points: TaperPoint[] | CoilPoint[],
  rotationUnit: 'deg' | 'percent',
  fullRotationDeg: number,
): StoredPoint[] {
  if (kind === 'taper') {
    const scale = rotationUnit === 'deg' ? 1 / fullRotationDeg : 1 / 100;
    return (points as TaperPoint[]).map((p) => ({
      x: p.rotation * scale,
      y: p.resistance,
      z: p.resistanceW3 ?? null,
      total: p.total ?? null,
    }));
  }
  return (points as CoilPoint[]).map((p) => {
    if ('re' in p) return { x: p.frequency, y: p.re, z: p.im, total: null };
    const phase = (p.phaseDeg * Math.PI) / 180;
    return { x: p.frequency, y: p.magnitude * Math.cos(phase), z: p.magnitude * Math.sin(phase), total: null };
  });
}

/** Inserts the sweep and its points (one prepared statement); call inside a transaction. */
export function insertSweep(
  db: DbLike,
  sqlite: Database.Database,
  sweep: { partId: number; kind: SweepKind; attachmentId: number | null; columns: Record<string, string> | null; createdBy: string },
  points: StoredPoint[],
): SweepRow {
  const row = db
    .insert(sweeps)
    .values({ ...sweep, pointCount: points.length })
    .returning()
    .get();
  const insertPoint = sqlite.prepare('insert into sweep_points (sweep_id, idx, x, y, z, total) values (?, ?, ?, ?, ?, ?)');
  points.forEach((p, i) => insertPoint.run(row.id, i, p.x, p.y, p.z, p.total ?? null));
  return row;
}
