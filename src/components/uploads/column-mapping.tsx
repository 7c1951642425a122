// The one column-mapping step of every upload (taper and impedance sweeps, lot readings): which column
// of the file holds what, and in which unit. Opened when the server answers `needs_mapping` (columns not
// recognised, or a column whose unit the file does not give); the same file is then sent again with
// the mapping. The logic lives in column-mapping-model.ts, driven by shared/csv/columns.ts.
import { useState } from 'react';
import { mappingRoles, roleWord } from '@shared/csv/columns';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import {
  buildMapping,
  initialChoices,
  initialForm,
  roleLabel,
  UNIT_NOT_CHOSEN,
  unitOptions,
  type Choice,
  type ChosenMapping,
  type ImpedanceForm,
  type MappingContext,
} from './column-mapping-model';

export function ColumnMappingStep({
  busy,
  onSend,
  onCancel,
  ...ctx
}: MappingContext & { busy: boolean; onSend: (mapping: ChosenMapping) => void; onCancel: () => void }) {
  const { kind, needs } = ctx;
  const [form, setForm] = useState<ImpedanceForm>(() => initialForm(needs));
  const [choices, setChoices] = useState<Record<string, Choice>>(() => initialChoices(ctx));
  const [error, setError] = useState<string | null>(null);
  const roles = mappingRoles(kind, form);

  const send = () => {
    const built = buildMapping(ctx, choices, form);
    if (!built.ok) return setError(built.error);
    setError(null);
    onSend(built.mapping);
  };

  return (
    <fieldset className="@container space-y-3 rounded-md border border-accent/30 bg-accent-tint/40 p-3 sm:p-4" data-testid="column-mapping">
      <legend className="px-1 text-sm font-semibold">Which column holds what?</legend>
      <p className="text-sm text-ink-soft">
        The file’s columns are:{' '}
        {needs.header.map((h, i) => (
          <span key={i} className="mr-1.5 inline-block rounded border border-paper-edge bg-paper-bright px-1.5 font-mono text-xs text-ink">
            {i + 1}: {h || '(no name)'}
          </span>
        ))}
      </p>
      {needs.unitNeeded?.map((u) => (
        <p key={u.role} className="text-sm">
          {u.reason}
        </p>
      ))}
      {kind === 'impedance' && (
        <div role="radiogroup" aria-label="How the file gives the impedance" className="flex flex-wrap gap-4 text-sm">
          <label className="flex items-center gap-1.5">
            <input type="radio" name="zform" checked={form === 'polar'} onChange={() => setForm('polar')} /> Magnitude and phase
          </label>
          <label className="flex items-center gap-1.5">
            <input type="radio" name="zform" checked={form === 'rect'} onChange={() => setForm('rect')} /> Real and imaginary parts
          </label>
        </div>
      )}
      {/* Two roles a row where the step is wide (the lot page), one where it is narrow (a part page's column). */}
      <div className="grid gap-3 @2xl:grid-cols-2">
        {roles.map(({ role, required }) => {
          const c = choices[role] ?? { column: '', unit: '' };
          const units = unitOptions(ctx, role);
          const label = roleLabel(role);
          const set = (patch: Partial<Choice>) => setChoices((all) => ({ ...all, [role]: { ...c, ...patch } }));
          return (
            <div key={role} className={`grid gap-2 ${units.length > 0 ? 'grid-cols-[1fr_9rem]' : 'grid-cols-1'}`}>
              <SelectField
                label={required ? label : `${label} (optional)`}
                value={c.column}
                onChange={(e) => set({ column: e.target.value })}
              >
                <option value="">{required ? 'Choose a column' : 'Not in the file'}</option>
                {needs.header.map((h, i) => (
                  <option key={i} value={i}>
                    {i + 1}: {h || '(no name)'}
                  </option>
                ))}
              </SelectField>
              {units.length > 0 && (
                <SelectField
                  label={`Unit of ${roleWord(role)}`}
                  value={c.unit}
                  onChange={(e) => set({ unit: e.target.value })}
                  disabled={c.column === ''}
                >
                  {c.unit === UNIT_NOT_CHOSEN && <option value={UNIT_NOT_CHOSEN}>Choose the unit</option>}
                  {units.map((u) => (
                    <option key={u.value} value={u.value}>
                      {u.label}
                    </option>
                  ))}
                </SelectField>
              )}
            </div>
          );
        })}
      </div>
      {error && <Alert>{error}</Alert>}
      <div className="flex flex-wrap gap-2">
        <Button variant="primary" onClick={send} busy={busy} busyText="Reading…">
          Read the file with these columns
        </Button>
        <Button onClick={onCancel}>Cancel</Button>
      </div>
    </fieldset>
  );
}
