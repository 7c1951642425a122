// The one column-mapping step's logic (src/components/uploads/column-mapping-model.ts): what it
// offers comes from shared/csv/columns.ts, and what it sends is read by the same readers the server uses.
import { describe, expect, it } from 'vitest';
import { mappingRoles, resolveColumns, type ColumnRole, type NeedsMapping, type TableKind } from '@shared/csv/columns';
import { parseLotRows } from '@shared/csv/lots';
import { parseSweepCsv } from '@shared/csv/sweeps';
import {
  buildMapping,
  initialChoices,
  initialForm,
  UNIT_NOT_CHOSEN,
  unitOptions,
  type MappingContext,
} from '@/components/uploads/column-mapping-model';

function needsOf(result: { ok: boolean; needsMapping?: NeedsMapping }): NeedsMapping {
  if (result.ok || !result.needsMapping) throw new Error('expected the mapping step');
  return result.needsMapping;
}

describe('every unit the step offers is one the reader accepts for that role', () => {
  const header = ['a', 'b', 'c', 'd', 'e'];
  const cases: [TableKind, 'capacitance' | 'resistance' | undefined][] = [
    ['taper', undefined],
    ['impedance', undefined],
    ['lot', 'capacitance'],
    ['lot', 'resistance'],
  ];
  for (const [kind, quantity] of cases) {
    it(`${kind}${quantity ? ` (${quantity})` : ''}`, () => {
      const ctx: MappingContext = { kind, needs: { header, detected: {}, missing: [] }, ...(quantity ? { quantity } : {}) };
      const roles = new Set<ColumnRole>([...mappingRoles(kind, 'polar'), ...mappingRoles(kind, 'rect')].map((r) => r.role));
      for (const role of roles) {
        for (const u of unitOptions(ctx, role)) {
          const r = resolveColumns(header, kind, { [role]: { column: 0, unit: u.value } });
          expect(r.issues, `${role} in ${u.value}`).toEqual([]);
          expect(r.mapping[role]?.index).toBe(0);
        }
      }
    });
  }
});

describe('a lot whose value column names no unit and holds 47', () => {
  const file = 'Item,C,Operator\n1,47.1,ab\n2,46.9,cd\n';
  const needs = needsOf(parseLotRows(file, { quantity: 'capacitance' }));
  const ctx: MappingContext = { kind: 'lot', quantity: 'capacitance', needs };

  it('starts with the detected columns and no unit chosen, and will not send until one is', () => {
    const choices = initialChoices(ctx);
    expect(choices.item).toEqual({ column: '0', unit: '' });
    expect(choices.value).toEqual({ column: '1', unit: UNIT_NOT_CHOSEN });
    expect(choices.second!.column).toBe(''); // optional roles start as "not in the file"
    const refused = buildMapping(ctx, choices);
    expect(refused).toEqual({ ok: false, error: 'Choose the unit the value is written in.' });
  });

  it('with nF chosen, the mapping it sends reads the file as 47.1 nF and 46.9 nF', () => {
    const choices = initialChoices(ctx);
    const built = buildMapping(ctx, { ...choices, value: { column: '1', unit: 'nF' } });
    if (!built.ok) throw new Error(built.error);
    expect(built.mapping).toEqual({ item: { column: 0 }, value: { column: 1, unit: 'nF' } });
    const read = parseLotRows(file, { quantity: 'capacitance', mapping: built.mapping });
    if (!read.ok) throw new Error(JSON.stringify(read.issues));
    expect(read.rows.map((r) => r.value)).toEqual([47.1e-9, 46.9e-9]);
    expect(read.ignored).toEqual(['Operator']);
  });
});

describe('a sweep whose headers were not recognised', () => {
  const file = 'Winkel,Widerstand,Sonst\n0,10,x\n150,5000,x\n300,10000,x\n';
  const needs = needsOf(parseSweepCsv(file, 'taper'));
  const ctx: MappingContext = { kind: 'taper', needs };

  it('suggests the columns in file order for the required roles only', () => {
    const choices = initialChoices(ctx);
    expect(choices.rotation!.column).toBe('0');
    expect(choices.resistance!.column).toBe('1');
    expect(choices.resistanceW3!.column).toBe('');
    expect(choices.total!.column).toBe('');
  });

  it('refuses one column for two roles and names both; the chosen mapping fits the sweep', () => {
    const choices = initialChoices(ctx);
    const twice = buildMapping(ctx, { ...choices, total: { column: '1', unit: 'Ω' } });
    expect(twice).toEqual({
      ok: false,
      error: 'One column cannot hold both the resistance lug 1 to wiper and the resistance lug 1 to lug 3 (R13).',
    });
    const built = buildMapping(ctx, choices);
    if (!built.ok) throw new Error(built.error);
    expect(built.mapping).toEqual({ rotation: { column: 0, unit: 'deg' }, resistance: { column: 1, unit: 'Ω' } });
    const read = parseSweepCsv(file, 'taper', { mapping: built.mapping });
    if (!read.ok) throw new Error(JSON.stringify(read.issues));
    expect(read.points.map((p) => p.resistance)).toEqual([10, 5000, 10000]);
    expect(read.ignored).toEqual(['Sonst']);
  });

  it('a required column left out is named', () => {
    const choices = initialChoices(ctx);
    expect(buildMapping(ctx, { ...choices, resistance: { column: '', unit: 'Ω' } })).toEqual({
      ok: false,
      error: 'Choose the column that holds the resistance lug 1 to wiper.',
    });
  });
});

describe('impedance files', () => {
  it('a file with a real part starts in the rectangular form; its pair is sent, not the polar one', () => {
    const needs: NeedsMapping = {
      header: ['Freq', 'Re Z (Ω)', 'Q'],
      detected: { re: { index: 1, scale: 1, header: 'Re Z (Ω)', unit: 'Ω', dimension: 'Ω' } },
      missing: ['frequency', 'im'],
    };
    const ctx: MappingContext = { kind: 'impedance', needs };
    expect(initialForm(needs)).toBe('rect');
    const choices = initialChoices(ctx);
    expect(choices.re).toEqual({ column: '1', unit: 'Ω' });
    const built = buildMapping(ctx, { ...choices, frequency: { column: '0', unit: 'Hz' }, im: { column: '2', unit: 'Ω' } }, 'rect');
    expect(built).toEqual({
      ok: true,
      mapping: { frequency: { column: 0, unit: 'Hz' }, re: { column: 1, unit: 'Ω' }, im: { column: 2, unit: 'Ω' } },
    });
  });
  it("a header's own unit outside the list is offered as it is, so its scale is kept", () => {
    const needs: NeedsMapping = {
      header: ['f', '|Z| (kOhm)', 'x'],
      detected: { magnitude: { index: 1, scale: 1000, header: '|Z| (kOhm)', unit: 'kOhm', dimension: 'Ω' } },
      missing: ['phase'],
    };
    const ctx: MappingContext = { kind: 'impedance', needs };
    expect(unitOptions(ctx, 'magnitude').map((u) => u.value)).toEqual(['Ω', 'kΩ', 'MΩ', 'kOhm']);
    expect(initialChoices(ctx).magnitude).toEqual({ column: '1', unit: 'kOhm' });
  });
});
