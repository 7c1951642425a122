// POST /api/harness/simulate's answer: one knob setting's response, per pickup too, as plain arrays.
// Computed on the request thread for an ordinary design, in a pool worker (server/pool/tasks.ts
// `harnessSimulate`) when parts × frequencies is large: 60 parts at 2,000 frequencies take ~90 ms.
import { simulateInstrument } from '@shared/circuit/metrics';
import type { Netlist } from '@shared/circuit/netlist';

/** Parts × frequencies above which the solve goes to the pool (a one-pickup design at 400 frequencies is ~5,000). */
export const INLINE_SIMULATION_WORK = 20_000;

export interface SimulateInput {
  netlist: Netlist;
  knobs: Record<string, number>;
  frequencies: number[];
}

export function simulationAnswer({ netlist, knobs, frequencies }: SimulateInput) {
  const r = simulateInstrument(netlist, knobs, frequencies);
  return {
    frequencies: Array.from(r.frequencies),
    magnitudeDb: Array.from(r.magnitudeDb),
    phaseDeg: Array.from(r.phaseDeg),
    metrics: r.metrics,
    signal: r.signal,
    note: r.note,
    perPickup: r.perPickup.map((p) => ({
      pickupId: p.pickupId,
      magnitudeDb: Array.from(p.magnitudeDb),
      phaseDeg: Array.from(p.phaseDeg),
    })),
  };
}
