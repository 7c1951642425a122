// Helpers of the Compare screen: group colours, number formats, the loaded tapers computed in the
// browser with the shared harness engine, and the rows of the CSV exports.
import { dialAtLevel, loadedTaper, volumeNetlist, type CompareGroup, type LoadedTaper, type PickupModel } from '@shared/analysis/compare';
import { ampLoad } from '@shared/circuit/loads';
import { PICKUP_PRESETS } from '@shared/circuit/presets';
import { CABLE_CAPACITANCE_PER_METRE, type CompareSettings } from '@shared/schemas/compare';
import { formatValue } from '@shared/units/format';
import { taperLaw } from '@shared/taper/law';
import { SERIES_COLOURS } from '@/components/charts/plot';
import type { CandidatePickup, TaperPot } from '../api/types';

/** One colour per group, in group order. */
export function groupColours(groups: readonly CompareGroup[]): Map<string, string> {
  return new Map(groups.map((g, i) => [g.key, SERIES_COLOURS[i % SERIES_COLOURS.length]!]));
}

/** A #rrggbb colour with an alpha (0–1) appended as two hex digits. */
export const withAlpha = (hex: string, alpha: number) =>
  `${hex}${Math.round(alpha * 255)
    .toString(16)
    .padStart(2, '0')}`;

export const pct = (fraction: number | null | undefined, digits = 1) =>
  fraction === null || fraction === undefined || !Number.isFinite(fraction) ? '—' : `${(fraction * 100).toFixed(digits)} %`;
export const signedPct = (p: number | null | undefined, digits = 1) =>
  p === null || p === undefined || !Number.isFinite(p) ? '—' : `${p > 0 ? '+' : ''}${p.toFixed(digits)} %`;
export const ohms = (v: number | null | undefined) => (v === null || v === undefined || !Number.isFinite(v) ? '—' : formatValue(v, 'Ω'));
export const dial = (v: number | null | undefined) => (v === null || v === undefined ? '—' : v.toFixed(2));

/** The pickup model a setting names; null when a measured pickup is chosen but not (or no longer) listed. */
export function pickupModel(
  choice: CompareSettings['pickup'],
  measured: readonly CandidatePickup[],
): { model: PickupModel; name: string } | null {
  if (choice.source === 'preset') {
    const p = PICKUP_PRESETS.find((x) => x.id === choice.id) ?? PICKUP_PRESETS[0]!;
    return { model: { R: p.values.pickupR, L: p.values.pickupL, C: p.values.pickupC, Rp: p.values.pickupRp ?? null }, name: p.name };
  }
  const m = measured.find((x) => x.id === choice.partId);
  return m ? { model: { R: m.R, L: m.L, C: m.C, Rp: m.Rp }, name: m.label } : null;
}

export const LEVEL_MARKS = [-6, -12, -20] as const;

export interface PotLoaded {
  pot: TaperPot;
  taper: LoadedTaper;
  /** Dial settings (0–10) at −6, −12 and −20 dB. */
  marks: (number | null)[];
}

/** The loaded taper of each pot: the pickup, the pot with its fitted law and total, the cable and the amplifier. */
export function loadedTapers(
  pots: readonly TaperPot[],
  pickup: PickupModel,
  settings: Pick<CompareSettings, 'cableLength' | 'ampR'>,
): PotLoaded[] {
  const load = ampLoad(settings.ampR, { lengthM: settings.cableLength, capPerMetre: CABLE_CAPACITANCE_PER_METRE });
  return pots.map((pot) => {
    const taper = loadedTaper(volumeNetlist(pickup, { R: pot.fit.total, law: taperLaw(pot.fit.law, pot.fit.m) }, load));
    return { pot, taper, marks: LEVEL_MARKS.map((db) => dialAtLevel(taper.dial, taper.relativeDb, db)) };
  });
}

const round = (v: number | null | undefined, digits = 6) =>
  v === null || v === undefined || !Number.isFinite(v) ? '' : Number(v.toPrecision(digits));

/** Curves CSV: one row per rotation, one column per pot (R1W/R13 on the common grid). */
export function curveRows(grid: readonly number[], pots: readonly TaperPot[]): (string | number)[][] {
  return [['rotation_fraction', ...pots.map((p) => p.label)], ...grid.map((x, i) => [round(x), ...pots.map((p) => round(p.gridCurve[i]))])];
}

export function potRows(pots: readonly TaperPot[], groupLabel: (p: TaperPot) => string) {
  return pots.map((p) => ({
    part: p.label,
    group: groupLabel(p),
    lot: p.lotCode ?? '',
    supplier: p.supplier ?? '',
    law: p.fit.law,
    m: round(p.fit.m),
    r2: round(p.fit.r2),
    max_deviation_pct: round(p.fit.maxPct),
    total_ohm: round(p.fit.total),
    total_deviation_pct: round(p.fit.totalDeviationPct),
    end_resistance_start_ohm: round(p.fit.endResistance.start),
    end_resistance_end_ohm: round(p.fit.endResistance.end),
  }));
}

export function groupRows(groups: readonly CompareGroup[]) {
  return groups.map((g) => ({
    group: g.label,
    n: g.partIds.length,
    m_mean: round(g.m?.mean),
    m_sd: round(g.m?.sd),
    m_min: round(g.m?.min),
    m_max: round(g.m?.max),
    total_mean_ohm: round(g.total?.mean),
    total_sd_ohm: round(g.total?.sd),
    total_min_ohm: round(g.total?.min),
    total_max_ohm: round(g.total?.max),
  }));
}
