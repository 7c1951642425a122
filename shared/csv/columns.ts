// What each column of a measurement file holds (its role) and in which unit, read from the header
// text — or given by the user in the column-mapping step when the header is not recognised.
//
// Header forms understood: `Name (unit)`, `Name [unit]`, `Name / unit`, `Name unit`, `Name_unit`,
// `Rotation°`, `Position %`, or a name alone (then the SI base unit; a rotation with no unit is
// decided from the values by the sweep reader). Units are read with the project's value parser
// (`@shared/units/parse`: SI prefixes p n u µ μ m k M meg, Ω/ohm/Ohm, F, H, Hz), so `kOhm`, `kΩ`,
// `MΩ`, `nF`, `uF`, `mH`, `kHz` give the scale factor to SI; `°`/`deg`, `rad` and `%`/`percent` are
// read here. The SI prefixes are case-sensitive with a unit (`mΩ` milli, `MΩ` mega), as in the parser.
import type { SweepKind } from '@shared/schemas/sweeps';
import { tryParseValue } from '@shared/units/parse';
import { csvIssue, type CsvIssue } from './issues';

export type TableKind = SweepKind | 'lot';

export type ColumnRole =
  | 'rotation'
  | 'resistance'
  | 'resistanceW3'
  | 'total'
  | 'frequency'
  | 'magnitude'
  | 'phase'
  | 're'
  | 'im'
  | 'item'
  | 'value'
  | 'second'
  | 'testFrequency';

export interface ColumnInfo {
  index: number;
  /** Multiply a cell's number by this to get SI (Ω, F, Hz; a fraction for a `%` dissipation factor). */
  scale: number;
  header: string;
  angleUnit?: 'deg' | 'rad';
  rotationUnit?: 'deg' | 'percent';
  /** The unit as written in the header (or the explicit mapping), e.g. `kΩ`; a cell may end with it. */
  unit?: string;
  /** Physical dimension of the unit: Ω, F, H, Hz, deg, rad, percent, or '' when none was written. */
  dimension?: UnitDimension;
  /** For the lot's second column: dissipation factor (D, tan δ) or ESR. */
  secondQuantity?: 'dissipation' | 'esr';
}

export type ColumnMapping = Partial<Record<ColumnRole, ColumnInfo>>;

/** What a file whose columns were not all recognised shows the mapping step (an upload's 422 `details.needsMapping`). */
export interface NeedsMapping {
  header: string[];
  detected: ColumnMapping;
  missing: ColumnRole[];
  /**
   * Columns that were found but whose unit the file does not say and the values cannot settle (a
   * capacitance column with no unit holding 47: pF? nF?): the mapping step asks for the unit.
   */
  unitNeeded?: { role: ColumnRole; index: number; header: string; reason: string }[];
}

/** The user's choice in the column-mapping step: a column (index or header text) and optionally its unit. */
export type ExplicitMapping = Partial<Record<ColumnRole, { column: number | string; unit?: string }>>;

export type UnitDimension = 'Ω' | 'F' | 'H' | 'Hz' | 'deg' | 'rad' | 'percent' | '';

export interface ParsedUnit {
  dimension: UnitDimension;
  /** 10^exp of the prefix (1 for none). */
  scale: number;
}

/** Roles needed by each kind; impedance needs frequency plus one complete pair (see detectColumns). */
export const REQUIRED_ROLES: Record<TableKind, ColumnRole[]> = {
  taper: ['rotation', 'resistance'],
  impedance: ['frequency', 'magnitude', 'phase'],
  lot: ['item', 'value'],
};

export const ROLES_OF: Record<TableKind, ColumnRole[]> = {
  taper: ['rotation', 'resistance', 'resistanceW3', 'total'],
  impedance: ['frequency', 'magnitude', 'phase', 're', 'im'],
  lot: ['item', 'value', 'second', 'testFrequency'],
};

/** Read a unit text such as `kΩ`, `kOhm`, `nF`, `kHz`, `°`, `rad`, `%`; null when it is not a unit. */
export function parseUnit(text: string): ParsedUnit | null {
  const u = text.trim();
  if (u === '') return { dimension: '', scale: 1 };
  const lower = u.toLowerCase();
  if (u === '°' || lower === 'deg' || lower === 'degree' || lower === 'degrees') {
    return { dimension: 'deg', scale: 1 };
  }
  if (lower === 'rad' || lower === 'radian' || lower === 'radians') return { dimension: 'rad', scale: 1 };
  if (u === '%' || lower === 'percent' || lower === 'pct') return { dimension: 'percent', scale: 1 };
  // Only letters and unit signs: keeps `1` + text from being read as a number with an exponent.
  if (!/^[A-Za-z\u00B5\u03BC\u03A9\u2126]+$/.test(u)) return null;
  const r = tryParseValue(`1${u}`);
  if (!r.ok) return null;
  const exp = Math.round(Math.log10(r.value));
  const scale = exp >= 0 ? 10 ** exp : 1 / 10 ** -exp;
  switch (r.unit) {
    case 'Ω':
    case 'F':
    case 'H':
    case 'Hz':
      return { dimension: r.unit, scale };
    case '':
      // A bare prefix (`R (k)`) scales a unit the role implies.
      return { dimension: '', scale };
    default:
      return null;
  }
}

export interface HeaderParts {
  /** Normalised name for matching: lower case, punctuation as spaces. */
  name: string;
  /** Same without spaces (`r w 3` → `rw3`). */
  compact: string;
  unitText: string;
  unit: ParsedUnit;
}

function normaliseName(name: string): string {
  return name
    .toLowerCase()
    .replace(/[|()[\]{}_\-.:/\\'"*]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
}

/** Split a header into its name and unit: `R (kΩ)`, `Resistance [kOhm]`, `f / Hz`, `Position %`, `R_kohm`. */
export function splitHeader(header: string): HeaderParts {
  const h = header.trim();
  const make = (name: string, unitText: string, unit: ParsedUnit): HeaderParts => {
    const n = normaliseName(name);
    return { name: n, compact: n.replace(/ /g, ''), unitText, unit };
  };
  const bracket = /^(.*?)\s*[([]\s*([^()[\]]*?)\s*[)\]]\s*$/.exec(h);
  if (bracket) {
    const u = parseUnit(bracket[2]!);
    if (u && bracket[2]!.trim() !== '') return make(bracket[1]!, bracket[2]!.trim(), u);
  }
  const slash = /^(.+?)\s*\/\s*([^/\s]+)$/.exec(h);
  if (slash) {
    const u = parseUnit(slash[2]!);
    if (u && u.dimension !== '') return make(slash[1]!, slash[2]!, u);
  }
  const glued = /^(.*?[^\s_])\s*(°|%)$/.exec(h);
  if (glued) return make(glued[1]!, glued[2]!, parseUnit(glued[2]!)!);
  const token = /^(.+?)[\s_]+(\S+)$/.exec(h);
  if (token) {
    const u = parseUnit(token[2]!);
    if (u && u.dimension !== '') return make(token[1]!, token[2]!, u);
  }
  // A header that is only a unit (`Hz`, `Ω`, `%`), unless it is also a name (`R` is the real part, not ohms).
  const whole = parseUnit(h);
  if (whole && whole.dimension !== '' && !ALL_NAMES.has(normaliseName(h).replace(/ /g, ''))) return make('', h, whole);
  return make(h, '', { dimension: '', scale: 1 });
}

// Names by role, compared with the compact form (lower case, no spaces or punctuation).
// Lug numbering (lug 1 counter-clockwise end, lug 2 the wiper, lug 3 the clockwise end, common
// practice): R1-2 / 1-W is lug 1 to wiper, R2-3 / W-3 wiper to lug 3, R1-3 end to end (the
// sweep's own R13, which the taper fit prefers to any bench reading).
const NAMES: Record<ColumnRole, ReadonlySet<string>> = {
  rotation: new Set([
    'rot',
    'rotation',
    'rotationangle',
    'angle',
    'shaftangle',
    'position',
    'pos',
    'travel',
    'wiperposition',
    'shaft',
    'knob',
    'turn',
  ]),
  resistanceW3: new Set([
    'rw3',
    'rwiper3',
    'rwiperto3',
    'rwipertolug3',
    'rwiperlug3',
    'r23',
    'r32',
    'r3w',
    'r2',
    'resistancew3',
    'resistancewiper3',
    'rwl3',
    'w3',
    '3w',
    '23',
    'r2 3',
    'r w 3',
  ]),
  resistance: new Set([
    'r',
    'r1w',
    'r1',
    'r12',
    'r21',
    'rw1',
    'rw',
    'r1wiper',
    'rwiper',
    'r1towiper',
    'rlug1wiper',
    'rlug1w',
    'resistance',
    'res',
    'resistance1w',
    'rmeas',
    '1w',
    'w1',
    '12',
    'r1 2',
    'r1 w',
  ]),
  total: new Set(['r13', 'r31', '13', 'r1 3', 'rtotal', 'total', 'rtot', 'endtoend', 'rendtoend', 'r1to3', 'rlug1lug3']),
  frequency: new Set(['f', 'freq', 'frequency', 'fr', 'frq']),
  magnitude: new Set(['z', 'mag', 'magnitude', 'absz', 'zabs', 'zmag', 'magz', 'impedance', 'modz', 'modulus', 'zmagnitude', 'magnitudez']),
  phase: new Set(['phase', 'angle', 'θ', 'theta', 'phi', 'φ', 'ϕ', 'arg', 'argz', 'zphase', 'phasez', 'phaseangle', 'zθ', 'θz', 'zangle']),
  re: new Set(['re', 'rez', 'zre', 'real', 'realz', 'zreal', 'realpart', 'r', 'rs', 'resistance', 'res']),
  im: new Set(['im', 'imz', 'zim', 'imag', 'imagz', 'zimag', 'imaginary', 'imaginarypart', 'x', 'xs', 'reactance']),
  item: new Set([
    'item',
    '#',
    'no',
    'nr',
    'number',
    'num',
    'serial',
    'serialno',
    'serialnumber',
    'sn',
    'part',
    'partno',
    'id',
    'index',
    'idx',
    'sample',
    'label',
    'itemno',
  ]),
  value: new Set([
    'value',
    'val',
    'c',
    'cs',
    'cp',
    'capacitance',
    'r',
    'rs',
    'rp',
    'resistance',
    'reading',
    'measured',
    'meas',
    'measurement',
  ]),
  second: new Set(['d', 'df', 'tanδ', 'tand', 'tandelta', 'tan', 'dissipation', 'dissipationfactor', 'esr', 'lossfactor']),
  testFrequency: new Set(['f', 'freq', 'frequency', 'testfreq', 'testfrequency', 'fr', 'frq']),
};
const IGNORED_TAPER_NAMES = new Set(['rend']);
const ALL_NAMES = new Set(Object.values(NAMES).flatMap((set) => [...set]));

/** Units each role accepts ('' = none written). */
const ROLE_DIMENSIONS: Record<ColumnRole, readonly UnitDimension[]> = {
  rotation: ['deg', 'percent', ''],
  resistance: ['Ω', ''],
  resistanceW3: ['Ω', ''],
  total: ['Ω', ''],
  frequency: ['Hz', ''],
  magnitude: ['Ω', ''],
  phase: ['deg', 'rad', ''],
  re: ['Ω', ''],
  im: ['Ω', ''],
  item: [''],
  value: ['Ω', 'F', ''],
  second: ['Ω', 'percent', ''],
  testFrequency: ['Hz', ''],
};

function columnInfo(role: ColumnRole, index: number, header: string, unitText: string, unit: ParsedUnit): ColumnInfo {
  const info: ColumnInfo = { index, scale: unit.scale, header, dimension: unit.dimension };
  if (unitText !== '') info.unit = unitText;
  if (role === 'rotation' && (unit.dimension === 'deg' || unit.dimension === 'percent')) info.rotationUnit = unit.dimension;
  if (role === 'phase') info.angleUnit = unit.dimension === 'rad' ? 'rad' : 'deg';
  if (role === 'second') {
    info.secondQuantity = unit.dimension === 'Ω' ? 'esr' : 'dissipation';
    if (unit.dimension === 'percent') info.scale = 0.01; // D in % → a fraction
  }
  return info;
}

/** Role for a header by its name, within a kind, ignoring roles already taken. */
function roleByName(parts: HeaderParts, kind: TableKind, taken: ColumnMapping): ColumnRole | null {
  if (kind === 'taper' && IGNORED_TAPER_NAMES.has(parts.compact)) return null;
  for (const role of ROLES_OF[kind]) {
    if (taken[role]) continue;
    if (!NAMES[role].has(parts.compact) && !NAMES[role].has(parts.name)) continue;
    if (!ROLE_DIMENSIONS[role].includes(parts.unit.dimension)) continue;
    if (role === 'second' && parts.compact === 'esr' && parts.unit.dimension === 'percent') continue;
    return role;
  }
  return null;
}

/** Role for a header whose name is unknown but whose unit says what it is. */
function roleByUnit(parts: HeaderParts, kind: TableKind, taken: ColumnMapping): ColumnRole | null {
  const d = parts.unit.dimension;
  const free = (r: ColumnRole) => (taken[r] ? null : r);
  if (kind === 'taper') {
    if (d === 'deg' || d === 'percent') return free('rotation');
    if (d === 'Ω') return free('resistance');
  } else if (kind === 'impedance') {
    if (d === 'Hz') return free('frequency');
    if (d === 'deg' || d === 'rad') return free('phase');
    if (d === 'Ω') return free('magnitude');
  } else {
    if (d === 'Hz') return free('testFrequency');
    if (d === 'F') return free('value');
    if (d === 'Ω') return free('value') ?? free('second');
  }
  return null;
}

export interface DetectedColumns {
  mapping: ColumnMapping;
  /** Roles still needed (for impedance: the missing part of the pair closest to complete). */
  missing: ColumnRole[];
  /** Header texts that map to no role. */
  unknown: string[];
}

/** Roles an impedance file still lacks: frequency, and the polar or the rectangular pair. */
function impedanceMissing(m: ColumnMapping): ColumnRole[] {
  const missing: ColumnRole[] = m.frequency ? [] : ['frequency'];
  if ((m.magnitude && m.phase) || (m.re && m.im)) return missing;
  const rect = (m.re ? 1 : 0) + (m.im ? 1 : 0);
  const polar = (m.magnitude ? 1 : 0) + (m.phase ? 1 : 0);
  if (rect > polar) return [...missing, ...(m.re ? [] : ['re' as const]), ...(m.im ? [] : ['im' as const])];
  return [...missing, ...(m.magnitude ? [] : ['magnitude' as const]), ...(m.phase ? [] : ['phase' as const])];
}

function missingRoles(kind: TableKind, m: ColumnMapping): ColumnRole[] {
  if (kind === 'impedance') return impedanceMissing(m);
  return REQUIRED_ROLES[kind].filter((r) => !m[r]);
}

/** Recognise the columns of a header for a kind of file. */
export function detectColumns(header: string[], kind: TableKind): DetectedColumns {
  const mapping: ColumnMapping = {};
  const parts = header.map(splitHeader);
  const assigned = new Set<number>();
  // Names first (so `Angle (°)` in an impedance file is the phase, not taken by a unit guess), then units.
  parts.forEach((p, i) => {
    const role = roleByName(p, kind, mapping);
    if (role) {
      mapping[role] = columnInfo(role, i, header[i]!, p.unitText, p.unit);
      assigned.add(i);
    }
  });
  parts.forEach((p, i) => {
    if (assigned.has(i) || (kind === 'taper' && IGNORED_TAPER_NAMES.has(p.compact))) return;
    const role = roleByUnit(p, kind, mapping);
    if (role) {
      mapping[role] = columnInfo(role, i, header[i]!, p.unitText, p.unit);
      assigned.add(i);
    }
  });
  const unknown = header.filter((_, i) => !assigned.has(i));
  return { mapping, missing: missingRoles(kind, mapping), unknown };
}

const ROLE_WORD: Record<ColumnRole, string> = {
  rotation: 'rotation',
  resistance: 'resistance lug 1 to wiper',
  resistanceW3: 'resistance wiper to lug 3',
  total: 'resistance lug 1 to lug 3 (R13)',
  frequency: 'frequency',
  magnitude: 'impedance magnitude',
  phase: 'phase',
  re: 'real part',
  im: 'imaginary part',
  item: 'item',
  value: 'value',
  second: 'second reading (D or ESR)',
  testFrequency: 'test frequency',
};

export function roleWord(role: ColumnRole): string {
  return ROLE_WORD[role];
}

/** A unit the column-mapping step offers: the text sent back as the mapping's unit (read by parseUnit) and its label. */
export interface UnitChoice {
  value: string;
  label: string;
}

const OHMS: UnitChoice[] = [
  { value: 'Ω', label: 'Ω' },
  { value: 'kΩ', label: 'kΩ' },
  { value: 'MΩ', label: 'MΩ' },
];
const HERTZ: UnitChoice[] = [
  { value: 'Hz', label: 'Hz' },
  { value: 'kHz', label: 'kHz' },
];
const FARADS: UnitChoice[] = [
  { value: 'pF', label: 'pF' },
  { value: 'nF', label: 'nF' },
  { value: 'µF', label: 'µF' },
  { value: 'F', label: 'F' },
];

/**
 * The units the mapping step offers for a role, each one the reader accepts for it (ROLE_DIMENSIONS);
 * the lot's value column follows the lot's quantity. The item has no unit (empty list).
 */
export function unitChoices(role: ColumnRole, quantity?: 'capacitance' | 'resistance'): UnitChoice[] {
  switch (role) {
    case 'rotation':
      return [
        { value: 'deg', label: 'degrees (°)' },
        { value: '%', label: 'percent (%)' },
      ];
    case 'phase':
      return [
        { value: 'deg', label: 'degrees (°)' },
        { value: 'rad', label: 'radians' },
      ];
    case 'resistance':
    case 'resistanceW3':
    case 'total':
    case 'magnitude':
    case 're':
    case 'im':
      return OHMS;
    case 'frequency':
    case 'testFrequency':
      return HERTZ;
    case 'value':
      return quantity === 'capacitance' ? FARADS : OHMS;
    case 'second':
      return [
        { value: '', label: 'D as a fraction' },
        { value: '%', label: 'D in %' },
        { value: 'Ω', label: 'ESR in Ω' },
        { value: 'mΩ', label: 'ESR in mΩ' },
      ];
    case 'item':
      return [];
  }
}

/** The roles the mapping step asks for, in order, and which of them a file must have. */
export function mappingRoles(kind: TableKind, impedanceForm: 'polar' | 'rect' = 'polar'): { role: ColumnRole; required: boolean }[] {
  if (kind === 'taper')
    return [
      { role: 'rotation', required: true },
      { role: 'resistance', required: true },
      { role: 'resistanceW3', required: false },
      { role: 'total', required: false },
    ];
  if (kind === 'impedance')
    return impedanceForm === 'polar'
      ? [
          { role: 'frequency', required: true },
          { role: 'magnitude', required: true },
          { role: 'phase', required: true },
        ]
      : [
          { role: 'frequency', required: true },
          { role: 're', required: true },
          { role: 'im', required: true },
        ];
  return [
    { role: 'item', required: true },
    { role: 'value', required: true },
    { role: 'second', required: false },
    { role: 'testFrequency', required: false },
  ];
}

const DIMENSION_WORD: Record<UnitDimension, string> = {
  Ω: 'ohms',
  F: 'farads',
  H: 'henries',
  Hz: 'hertz',
  deg: 'degrees',
  rad: 'radians',
  percent: 'percent',
  '': 'no unit',
};

export interface ResolvedColumns {
  mapping: ColumnMapping;
  missing: ColumnRole[];
  unknown: string[];
  /** Problems with an explicit mapping (a column that does not exist, a unit that does not fit). */
  issues: CsvIssue[];
  /** What was detected from the header alone, for the mapping step. */
  detected: ColumnMapping;
}

/**
 * Detected columns with an explicit mapping laid over them: each explicitly mapped role takes its
 * column (and unit, else the unit the header gives), and a detected role that used that column is dropped.
 */
export function resolveColumns(header: string[], kind: TableKind, explicit?: ExplicitMapping): ResolvedColumns {
  const detected = detectColumns(header, kind);
  if (!explicit || Object.keys(explicit).length === 0) return { ...detected, issues: [], detected: detected.mapping };
  const mapping: ColumnMapping = { ...detected.mapping };
  const issues: CsvIssue[] = [];
  const lowered = header.map((h) => h.trim().toLowerCase());
  for (const [roleKey, choice] of Object.entries(explicit)) {
    const role = roleKey as ColumnRole;
    if (!choice) continue;
    if (!ROLES_OF[kind].includes(role)) {
      issues.push(csvIssue(null, null, `The mapping names the role "${role}", which a ${kind} file does not have.`));
      continue;
    }
    const index = typeof choice.column === 'number' ? choice.column : lowered.indexOf(String(choice.column).trim().toLowerCase());
    if (!Number.isInteger(index) || index < 0 || index >= header.length) {
      issues.push(
        csvIssue(
          null,
          typeof choice.column === 'string' ? choice.column : null,
          `the ${roleWord(role)} is mapped to a column the file does not have (its columns: ${header.map((h) => `"${h}"`).join(', ')}).`,
        ),
      );
      continue;
    }
    const h = header[index]!;
    const fromHeader = splitHeader(h);
    let unitText = fromHeader.unitText;
    let unit = fromHeader.unit;
    if (choice.unit !== undefined) {
      const u = parseUnit(choice.unit);
      if (!u) {
        issues.push(csvIssue(null, h, `"${choice.unit}" is not a unit this reader knows (for example kΩ, nF, kHz, deg, rad, %).`));
        continue;
      }
      unitText = choice.unit.trim();
      unit = u;
    }
    if (!ROLE_DIMENSIONS[role].includes(unit.dimension)) {
      issues.push(csvIssue(null, h, `the unit "${unitText}" (${DIMENSION_WORD[unit.dimension]}) does not fit the ${roleWord(role)}.`));
      continue;
    }
    for (const r of Object.keys(mapping) as ColumnRole[]) if (mapping[r]?.index === index) delete mapping[r];
    mapping[role] = columnInfo(role, index, h, unitText, unit);
  }
  const used = new Set(Object.values(mapping).map((c) => c!.index));
  return {
    mapping,
    missing: missingRoles(kind, mapping),
    unknown: header.filter((_, i) => !used.has(i)),
    issues,
    detected: detected.mapping,
  };
}

/** role → header text of the column used. */
export function columnsUsed(mapping: ColumnMapping, roles: ColumnRole[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const r of roles) {
    const c = mapping[r];
    if (c) out[r] = c.header;
  }
  return out;
}

/** Power of ten of a scale, or null when it is not one (then multiply). */
export function scaleExponent(scale: number): number | null {
  const e = Math.round(Math.log10(scale));
  return Math.abs(scale - (e >= 0 ? 10 ** e : 1 / 10 ** -e)) <= Math.abs(scale) * 1e-12 ? e : null;
}
