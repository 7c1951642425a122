// A thin wrapper over ngspice compiled to WebAssembly (npm `eecircuit-engine`), the reference
// simulator for the circuit and coil checks. One instance holds ~0.4 GB: start one per test file.
import { Simulation } from 'eecircuit-engine';

export interface AcResult {
  frequencies: number[];
  /** Complex value of each requested node voltage, by lower-case node name (e.g. 'out'). */
  nodes: Record<string, { re: number; im: number }[]>;
}

export class Ngspice {
  private sim = new Simulation();
  private started = false;

  async start(): Promise<void> {
    if (this.started) return;
    await this.sim.start();
    this.started = true;
  }

  /** Runs a netlist that contains an `.ac` analysis and returns its frequency axis and node voltages. */
  async runAc(netlist: string): Promise<AcResult> {
    await this.start();
    this.sim.setNetList(netlist);
    const result = await this.sim.runSim();
    const errors = this.sim.getError().filter((e) => /error/i.test(e));
    if (errors.length > 0) throw new Error(`ngspice: ${errors.join('\n')}`);
    if (result.dataType !== 'complex') throw new Error('ngspice: expected a complex (AC) result');
    const freq = result.data.find((d) => d.type === 'frequency');
    if (!freq) throw new Error('ngspice: no frequency vector in the result');
    const nodes: AcResult['nodes'] = {};
    for (const d of result.data) {
      if (d.type !== 'voltage') continue;
      const name = d.name.toLowerCase().replace(/^v\((.*)\)$/, '$1');
      nodes[name] = d.values.map((v) => ({ re: v.real, im: v.img }));
    }
    return { frequencies: freq.values.map((v) => v.real), nodes };
  }
}
