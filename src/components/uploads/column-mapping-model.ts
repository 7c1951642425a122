// The column-mapping step's logic, for every upload kind (taper and impedance sweeps, lots): which
// roles it asks for, the units offered, the first choices from what the reader detected, and the
// mapping sent back. The roles, their words and their units come from shared/csv/columns.ts, the
// same module the server reads the file with, so the step can only offer what the reader accepts.
import {
  mappingRoles,
  roleWord,
  unitChoices,
  type ColumnRole,
  type NeedsMapping,
  type TableKind,
  type UnitChoice,
} from '@shared/csv/columns';

export interface MappingContext {
  kind: TableKind;
  /** A lot's quantity (its value column's units); absent for sweeps. */
  quantity?: 'capacitance' | 'resistance';
  needs: NeedsMapping;
}

export type ImpedanceForm = 'polar' | 'rect';

/** What the step sends: role → the column's index and, where the role has units, the unit. */
export type ChosenMapping = Partial<Record<ColumnRole, { column: number; unit?: string }>>;

/** One role's choice as the selects hold it: the column index as text ('' = none) and the unit text. */
export interface Choice {
  column: string;
  unit: string;
}

/** The unit select's value before the user chose one, where the file gives none the values can settle. */
export const UNIT_NOT_CHOSEN = '?';

const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** "Resistance lug 1 to wiper" */
export function roleLabel(role: ColumnRole): string {
  return cap(roleWord(role));
}

/** The roles of every form of the kind (both impedance forms), so switching form keeps the choices. */
function allRoles(kind: TableKind): ColumnRole[] {
  const roles = [...mappingRoles(kind, 'polar'), ...(kind === 'impedance' ? mappingRoles(kind, 'rect') : [])].map((r) => r.role);
  return [...new Set(roles)];
}

export function initialForm(needs: NeedsMapping): ImpedanceForm {
  return needs.detected.re || needs.detected.im ? 'rect' : 'polar';
}

function unitAsked(ctx: MappingContext, role: ColumnRole): boolean {
  return ctx.needs.unitNeeded?.some((u) => u.role === role) ?? false;
}

/** The units offered for a role: the reader's list, plus the header's own unit when it is another one (kOhm). */
export function unitOptions(ctx: MappingContext, role: ColumnRole): UnitChoice[] {
  const base = unitChoices(role, ctx.quantity);
  const fromHeader = ctx.needs.detected[role]?.unit;
  if (base.length === 0 || fromHeader === undefined || base.some((u) => u.value === fromHeader)) return base;
  return [...base, { value: fromHeader, label: `${fromHeader} (as in the header)` }];
}

/**
 * First choices: a detected column with the header's unit; a role whose unit the reader asks for
 * starts with no unit chosen; a required role that was not detected is offered the next column in
 * file order that no other role holds; an optional one starts as "not in the file".
 */
export function initialChoices(ctx: MappingContext): Record<string, Choice> {
  const roles = allRoles(ctx.kind);
  const taken = new Set(roles.map((r) => ctx.needs.detected[r]?.index).filter((i): i is number => i !== undefined));
  const out: Record<string, Choice> = {};
  for (const form of ctx.kind === 'impedance' ? (['polar', 'rect'] as const) : (['polar'] as const)) {
    const suggested = new Set(taken);
    for (const { role, required } of mappingRoles(ctx.kind, form)) {
      if (out[role]) {
        suggested.add(Number(out[role].column));
        continue;
      }
      const units = unitOptions(ctx, role);
      const d = ctx.needs.detected[role];
      const firstUnit = units[0]?.value ?? '';
      if (d) {
        const unit = unitAsked(ctx, role)
          ? UNIT_NOT_CHOSEN
          : d.unit !== undefined && units.some((u) => u.value === d.unit)
            ? d.unit
            : firstUnit;
        out[role] = { column: String(d.index), unit };
        continue;
      }
      let column = '';
      if (required) {
        const free = ctx.needs.header.findIndex((_, i) => !suggested.has(i));
        if (free >= 0) {
          column = String(free);
          suggested.add(free);
        }
      }
      out[role] = { column, unit: firstUnit };
    }
  }
  return out;
}

/** The mapping to send, or what is wrong with the choices (in words for the step). */
export function buildMapping(
  ctx: MappingContext,
  choices: Record<string, Choice>,
  form: ImpedanceForm = 'polar',
): { ok: true; mapping: ChosenMapping } | { ok: false; error: string } {
  const used = new Map<string, ColumnRole>();
  const mapping: ChosenMapping = {};
  for (const { role, required } of mappingRoles(ctx.kind, form)) {
    const c = choices[role] ?? { column: '', unit: '' };
    if (c.column === '') {
      if (required) return { ok: false, error: `Choose the column that holds the ${roleWord(role)}.` };
      continue;
    }
    const other = used.get(c.column);
    if (other) return { ok: false, error: `One column cannot hold both the ${roleWord(other)} and the ${roleWord(role)}.` };
    used.set(c.column, role);
    const units = unitOptions(ctx, role);
    if (units.length > 0 && !units.some((u) => u.value === c.unit))
      return { ok: false, error: `Choose the unit the ${roleWord(role)} is written in.` };
    mapping[role] = { column: Number(c.column), ...(units.length > 0 ? { unit: c.unit } : {}) };
  }
  return { ok: true, mapping };
}
