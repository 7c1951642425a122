// The coil's lumped network as any circuits text writes it, for tests that make sweeps of a known
// coil: R + jωL in series, with C and (optionally) Rp across; 1/Z = 1/(R + jωL) + jωC + 1/Rp.
export type Complex = { re: number; im: number };
export type CoilNetwork = { R: number; L: number; C: number; Rp?: number };

/** Z of the network at f (Hz); C may be 0 and Rp absent. */
export function textbookZ(p: CoilNetwork, f: number): Complex {
  const w = 2 * Math.PI * f;
  const d = p.R * p.R + w * w * p.L * p.L;
  const yRe = p.R / d + (p.Rp === undefined ? 0 : 1 / p.Rp);
  const yIm = -(w * p.L) / d + w * p.C;
  const yy = yRe * yRe + yIm * yIm;
  return { re: yRe / yy, im: -yIm / yy };
}
