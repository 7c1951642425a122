// The quantities a reading can carry, with their SI unit symbols and words for people.
// Unit symbols follow the SI Brochure (BIPM, 9th ed., 2019): ohm Ω, farad F, henry H, hertz Hz,
// volt V; the degree ° is accepted for use with the SI (Table 8). Dissipation factor D, quality
// factor Q and plain ratios are dimensionless, so their unit is the empty string.

export type Quantity =
  'resistance' | 'capacitance' | 'inductance' | 'frequency' | 'dissipation' | 'esr' | 'q' | 'ratio' | 'angle' | 'voltage';

export const QUANTITIES: readonly Quantity[] = [
  'resistance',
  'capacitance',
  'inductance',
  'frequency',
  'dissipation',
  'esr',
  'q',
  'ratio',
  'angle',
  'voltage',
];

export const QUANTITY_UNIT: Record<Quantity, string> = {
  resistance: 'Ω',
  capacitance: 'F',
  inductance: 'H',
  frequency: 'Hz',
  dissipation: '',
  esr: 'Ω',
  q: '',
  ratio: '',
  angle: '°',
  voltage: 'V',
};

export const QUANTITY_LABEL: Record<Quantity, string> = {
  resistance: 'resistance',
  capacitance: 'capacitance',
  inductance: 'inductance',
  frequency: 'frequency',
  dissipation: 'dissipation factor',
  esr: 'equivalent series resistance',
  q: 'quality factor',
  ratio: 'ratio',
  angle: 'phase angle',
  voltage: 'voltage',
};

/** Quantities that cannot be negative for a passive part (a negative reading is an input error). */
export const NON_NEGATIVE_QUANTITIES: ReadonlySet<Quantity> = new Set<Quantity>([
  'resistance',
  'capacitance',
  'inductance',
  'frequency',
  'esr',
]);
