// Export of a harness at one knob setting as a plain SPICE3 netlist (title line, elements, `.ac`,
// `.end`), for a user's own simulator and for the engine's check against ngspice. Pots are written
// as their two halves at the knob setting; the pickup as its EMF source, R and L in series, with C
// (and Rp) across its terminals — the full lumped model, not the solver's Norton equivalent.
import { GROUND, knobSetting, OUTPUT, potHalves, validateNetlist, type Knobs, type Netlist } from './netlist';

export interface SpiceExportOptions {
  /** Hz, default 20 */
  fStart?: number;
  /** Hz, default 20000 */
  fStop?: number;
  /** default 50, which gives the engine's default 151-point axis from 20 Hz to 20 kHz */
  pointsPerDecade?: number;
}

/**
 * A number as SPICE reads it, to 12 significant digits (as C's %.12g): enough that the rounding
 * of a pot half (relative 5e-13) moves the response by far less than 1e-6 dB.
 */
export function spiceNumber(v: number): string {
  if (!Number.isFinite(v)) throw new Error(`SPICE export: value ${v} is not finite`);
  const s = v.toPrecision(12);
  const [mant, exp] = s.split('e') as [string, string | undefined];
  const trimmed = mant.includes('.') ? mant.replace(/0+$/, '').replace(/\.$/, '') : mant;
  return exp === undefined ? trimmed : `${trimmed}e${exp}`;
}

/** SPICE node names: lower case, letters, digits and underscores; ground stays 0, out stays out. */
function nodeNamer(): (node: string) => string {
  const map = new Map<string, string>([
    [GROUND, '0'],
    [OUTPUT, 'out'],
  ]);
  const used = new Set(map.values());
  return (node) => {
    const known = map.get(node);
    if (known !== undefined) return known;
    const base = `n_${node.toLowerCase().replace(/[^a-z0-9_]/g, '_')}`;
    let name = base;
    for (let i = 2; used.has(name); i++) name = `${base}_${i}`;
    used.add(name);
    map.set(node, name);
    return name;
  };
}

function elementNamer(): (prefix: string, id: string) => string {
  const used = new Set<string>();
  return (prefix, id) => {
    const base = `${prefix}${id.toLowerCase().replace(/[^a-z0-9_]/g, '_')}`;
    let name = base;
    for (let i = 2; used.has(name); i++) name = `${base}_${i}`;
    used.add(name);
    return name;
  };
}

export function toSpiceNetlist(netlist: Netlist, knobs: Knobs, options: SpiceExportOptions = {}): string {
  const problems = validateNetlist(netlist);
  if (problems.length > 0) throw new Error(`invalid harness netlist: ${problems.join('; ')}`);
  const fStart = options.fStart ?? 20;
  const fStop = options.fStop ?? 20000;
  const perDecade = options.pointsPerDecade ?? 50;
  const node = nodeNamer();
  const el = elementNamer();
  const title = (netlist.title ?? 'harness').replace(/[\r\n]+/g, ' ');
  // The knobs the pots follow, in order of first use: "(volume 5, tone 3)".
  const knobIds: string[] = [];
  for (const p of netlist.parts) if (p.kind === 'pot' && typeof p.knob === 'string' && !knobIds.includes(p.knob)) knobIds.push(p.knob);
  const setting = knobIds.map((id) => `${id} ${knobSetting(id, knobs)}`).join(', ');
  const lines: string[] = [
    `${title}${setting ? ` (${setting})` : ''}`,
    '* Exported by the Lugbook harness engine: small-signal AC, transfer = V(out) per volt of pickup EMF.',
  ];
  for (const p of netlist.parts) {
    switch (p.kind) {
      case 'resistor':
        lines.push(`${el('R', p.id)} ${node(p.a)} ${node(p.b)} ${spiceNumber(p.R)}`);
        break;
      case 'capacitor':
        lines.push(`${el('C', p.id)} ${node(p.a)} ${node(p.b)} ${spiceNumber(p.C)}`);
        break;
      case 'inductor':
        lines.push(`${el('L', p.id)} ${node(p.a)} ${node(p.b)} ${spiceNumber(p.L)}`);
        break;
      case 'pot': {
        const { aw, wb } = potHalves(p, knobs);
        lines.push(
          `* pot ${p.id}: ${spiceNumber(p.R)} ohm at knob ${typeof p.knob === 'string' ? `${p.knob} ${knobSetting(p.knob, knobs)}` : p.knob.fixed}`,
        );
        lines.push(`${el('R', `${p.id}_aw`)} ${node(p.a)} ${node(p.w)} ${spiceNumber(aw)}`);
        if (p.b !== undefined) lines.push(`${el('R', `${p.id}_wb`)} ${node(p.w)} ${node(p.b)} ${spiceNumber(wb)}`);
        break;
      }
      case 'pickup': {
        const emfNode = node(`${p.id}#emf`);
        const coilNode = node(`${p.id}#coil`);
        const emf = p.emf ?? 1;
        lines.push(
          `* pickup ${p.id}${p.group !== undefined && p.group !== p.id ? ` (of ${p.group})` : ''}: EMF in series with R and L from cold to hot, C (and Rp) across${emf < 0 ? '; reversed' : ''}`,
        );
        // A reversed source is written as its magnitude at phase 180°.
        lines.push(`${el('V', p.id)} ${emfNode} ${node(p.cold)} DC 0 AC ${spiceNumber(Math.abs(emf))}${emf < 0 ? ' 180' : ''}`);
        // A zero L or C (an ideal resistive source) is left out rather than written as 0.
        lines.push(`${el('R', `${p.id}_dc`)} ${emfNode} ${p.L > 0 ? coilNode : node(p.hot)} ${spiceNumber(p.R)}`);
        if (p.L > 0) lines.push(`${el('L', p.id)} ${coilNode} ${node(p.hot)} ${spiceNumber(p.L)}`);
        if (p.C > 0) lines.push(`${el('C', `${p.id}_self`)} ${node(p.hot)} ${node(p.cold)} ${spiceNumber(p.C)}`);
        if (p.Rp !== undefined) lines.push(`${el('R', `${p.id}_loss`)} ${node(p.hot)} ${node(p.cold)} ${spiceNumber(p.Rp)}`);
        break;
      }
    }
  }
  lines.push(`.ac dec ${perDecade} ${spiceNumber(fStart)} ${spiceNumber(fStop)}`);
  lines.push('.end');
  return `${lines.join('\n')}\n`;
}
