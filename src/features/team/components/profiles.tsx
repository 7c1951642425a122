// Tolerance profiles: the shop's rule per kind of part. QA and admins write them; everyone on the
// Team screen reads them.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { ProfileInputSchema, type ProfileInput, type ProfileRules } from '@shared/schemas/bench';
import { PART_KINDS, PartKindSchema, type PartKind } from '@shared/schemas/common';
import { NOMINAL_QUANTITY } from '@shared/schemas/parts';
import { TAPER_LAW_LABEL, TAPER_LAWS } from '@shared/taper/law';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT } from '@shared/units/quantities';
import { useProfiles, type Profile } from '@/data/profiles';
import { Alert, Loading } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { useCan } from '@/lib/auth';
import { applyServerError } from '@/lib/form';
import { formatTolerance } from '@/lib/format';
import { useSaveProfile } from '../api/save-profile';
import { asText, engineering, pctText, plainNumber, type Parsed } from './field-text';

const KIND_LABEL: Record<PartKind, string> = { pot: 'Pot', capacitor: 'Capacitor', resistor: 'Resistor', pickup: 'Pickup', other: 'Other' };
const LAWS = [['', 'Any law'], ...TAPER_LAWS.map((l) => [l, TAPER_LAW_LABEL[l]] as const), ['audio-any', 'Audio or two-segment']] as const;

const Fields = z.object({
  name: z.string(),
  kind: PartKindSchema,
  nominalMin: z.string(),
  nominalMax: z.string(),
  tolerancePct: z.string(),
  law: z.string(),
  mMinPct: z.string(),
  mMaxPct: z.string(),
  maxEndResistance: z.string(),
  dissipationMax: z.string(),
  dissipationFrequency: z.string(),
  esrMax: z.string(),
  inductanceNominal: z.string(),
  inductanceTolerancePct: z.string(),
  minQ: z.string(),
});
type Values = z.input<typeof Fields>;
type FieldName = keyof Values;
const FIELD_NAMES = Object.keys(Fields.shape) as FieldName[];
const RULE_FIELD: Record<string, FieldName> = { mMin: 'mMinPct', mMax: 'mMaxPct' };

const Schema = Fields.transform((v, ctx): ProfileInput => {
  let failed = false;
  const take = (field: FieldName, r: Parsed) => {
    if (r.ok) return r.value;
    failed = true;
    ctx.addIssue({ code: 'custom', path: [field], message: r.error });
    return undefined;
  };
  const q = NOMINAL_QUANTITY[v.kind];
  const pct = (field: FieldName) => {
    const n = take(field, plainNumber(v[field]));
    return n === undefined ? undefined : n / 100;
  };
  const rules: ProfileRules = {};
  const put = <K extends keyof ProfileRules>(key: K, value: ProfileRules[K] | undefined) => {
    if (value !== undefined) rules[key] = value;
  };
  if (v.kind === 'pot') {
    if (v.law) put('law', v.law as ProfileRules['law']);
    put('mMin', pct('mMinPct'));
    put('mMax', pct('mMaxPct'));
    put('maxEndResistance', take('maxEndResistance', engineering(v.maxEndResistance, 'resistance')));
  }
  if (v.kind === 'capacitor') {
    put('dissipationMax', take('dissipationMax', engineering(v.dissipationMax, 'dissipation')));
    put('dissipationFrequency', take('dissipationFrequency', engineering(v.dissipationFrequency, 'frequency')));
    put('esrMax', take('esrMax', engineering(v.esrMax, 'esr')));
  }
  if (v.kind === 'pickup') {
    put('inductanceNominal', take('inductanceNominal', engineering(v.inductanceNominal, 'inductance')));
    put('inductanceTolerancePct', take('inductanceTolerancePct', plainNumber(v.inductanceTolerancePct)));
    put('minQ', take('minQ', plainNumber(v.minQ)));
  }
  const candidate = {
    name: v.name,
    kind: v.kind,
    nominalMin: take('nominalMin', engineering(v.nominalMin, q)) ?? null,
    nominalMax: take('nominalMax', engineering(v.nominalMax, q)) ?? null,
    tolerancePct: take('tolerancePct', plainNumber(v.tolerancePct)),
    rules,
  };
  const checked = ProfileInputSchema.safeParse(candidate);
  if (!checked.success) {
    for (const issue of checked.error.issues) {
      const [first, second] = issue.path.map(String);
      const field = first === 'rules' ? (RULE_FIELD[second ?? ''] ?? (second as FieldName)) : (first as FieldName);
      ctx.addIssue({
        code: 'custom',
        path: [FIELD_NAMES.includes(field) ? field : 'name'],
        message: first === 'tolerancePct' && candidate.tolerancePct === undefined ? 'Give the tolerance in percent.' : issue.message,
      });
    }
    return z.NEVER;
  }
  if (failed) return z.NEVER;
  return checked.data;
});

const toValues = (p?: Profile): Values => ({
  name: p?.name ?? '',
  kind: p?.kind ?? 'pot',
  nominalMin: p ? asText(p.nominalMin, NOMINAL_QUANTITY[p.kind]) : '',
  nominalMax: p ? asText(p.nominalMax, NOMINAL_QUANTITY[p.kind]) : '',
  tolerancePct: p ? String(p.tolerancePct) : '',
  law: p?.rules.law ?? '',
  mMinPct: pctText(p?.rules.mMin),
  mMaxPct: pctText(p?.rules.mMax),
  maxEndResistance: asText(p?.rules.maxEndResistance, 'resistance'),
  dissipationMax: p?.rules.dissipationMax != null ? String(p.rules.dissipationMax) : '',
  dissipationFrequency: asText(p?.rules.dissipationFrequency, 'frequency'),
  esrMax: asText(p?.rules.esrMax, 'esr'),
  inductanceNominal: asText(p?.rules.inductanceNominal, 'inductance'),
  inductanceTolerancePct: p?.rules.inductanceTolerancePct != null ? String(p.rules.inductanceTolerancePct) : '',
  minQ: p?.rules.minQ != null ? String(p.rules.minQ) : '',
});

function ProfileForm({ profile, onDone }: { profile?: Profile; onDone: () => void }) {
  const save = useSaveProfile();
  const form = useForm<Values, unknown, ProfileInput>({ resolver: zodResolver(Schema), defaultValues: toValues(profile) });
  const { errors } = form.formState;
  const kind = form.watch('kind');
  const unit = QUANTITY_UNIT[NOMINAL_QUANTITY[kind]];
  const reg = (name: FieldName) => ({ ...form.register(name), error: errors[name]?.message, autoComplete: 'off', spellCheck: false });

  const onSubmit = form.handleSubmit(async (input) => {
    try {
      await save.mutateAsync({ id: profile?.id, input });
      onDone();
    } catch (err) {
      applyServerError(err, form.setError, FIELD_NAMES);
    }
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label={profile ? `Edit profile ${profile.name}` : 'New tolerance profile'}
      className="space-y-4 rounded-md border border-paper-edge bg-paper p-3 sm:p-4"
    >
      <h3 className="text-sm font-semibold">{profile ? `Edit “${profile.name}”` : 'New tolerance profile'}</h3>
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
        <TextField label="Name" className="lg:col-span-2" {...reg('name')} />
        <SelectField label="Kind" error={errors.kind?.message} {...form.register('kind')}>
          {PART_KINDS.map((k) => (
            <option key={k} value={k}>
              {KIND_LABEL[k]}
            </option>
          ))}
        </SelectField>
        <TextField label="Tolerance (±%)" inputMode="decimal" inputClassName="num" {...reg('tolerancePct')} />
        <div />
        <TextField label={`Smallest nominal (${unit})`} inputClassName="num" hint="Blank: any" {...reg('nominalMin')} />
        <TextField label={`Largest nominal (${unit})`} inputClassName="num" hint="Blank: any" {...reg('nominalMax')} />
      </div>
      {kind === 'pot' && (
        <fieldset className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <legend className="mb-1 text-xs font-medium uppercase tracking-wide text-ink-soft">Taper rules</legend>
          <SelectField label="Law" error={errors.law?.message} {...form.register('law')}>
            {LAWS.map(([v, l]) => (
              <option key={v} value={v}>
                {l}
              </option>
            ))}
          </SelectField>
          <TextField label="Mid-rotation m, from (%)" inputMode="decimal" inputClassName="num" hint="e.g. 8" {...reg('mMinPct')} />
          <TextField label="Mid-rotation m, to (%)" inputMode="decimal" inputClassName="num" hint="e.g. 20" {...reg('mMaxPct')} />
          <TextField label="Largest end resistance (Ω)" inputClassName="num" hint="e.g. 500, 1k" {...reg('maxEndResistance')} />
        </fieldset>
      )}
      {kind === 'capacitor' && (
        <fieldset className="grid gap-3 sm:grid-cols-3">
          <legend className="mb-1 text-xs font-medium uppercase tracking-wide text-ink-soft">Loss rules</legend>
          <TextField label="Largest dissipation factor D" inputClassName="num" hint="e.g. 0.01 or 1 %" {...reg('dissipationMax')} />
          <TextField label="…measured at (Hz)" inputClassName="num" hint="e.g. 1k" {...reg('dissipationFrequency')} />
          <TextField label="Largest ESR (Ω)" inputClassName="num" hint="e.g. 2, 0R5" {...reg('esrMax')} />
        </fieldset>
      )}
      {kind === 'pickup' && (
        <fieldset className="grid gap-3 sm:grid-cols-3">
          <legend className="mb-1 text-xs font-medium uppercase tracking-wide text-ink-soft">Coil rules</legend>
          <TextField label="Nominal inductance (H)" inputClassName="num" hint="e.g. 4.3, 2500m" {...reg('inductanceNominal')} />
          <TextField label="Inductance tolerance (±%)" inputMode="decimal" inputClassName="num" {...reg('inductanceTolerancePct')} />
          <TextField label="Smallest Q" inputMode="decimal" inputClassName="num" {...reg('minQ')} />
        </fieldset>
      )}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" busy={save.isPending} busyText="Saving…">
          {profile ? 'Save changes' : 'Add profile'}
        </Button>
        <Button onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}

function rulesWords(p: Profile): string[] {
  const r = p.rules;
  const out: string[] = [];
  if (r.law) out.push(`law ${LAWS.find(([v]) => v === r.law)?.[1].toLowerCase() ?? r.law}`);
  if (r.mMin != null || r.mMax != null)
    out.push(`m ${r.mMin != null ? (r.mMin * 100).toFixed(0) : '…'}–${r.mMax != null ? (r.mMax * 100).toFixed(0) : '…'} %`);
  if (r.maxEndResistance != null) out.push(`end ≤ ${formatValue(r.maxEndResistance, 'Ω')}`);
  if (r.dissipationMax != null)
    out.push(`D ≤ ${r.dissipationMax}${r.dissipationFrequency ? ` at ${formatValue(r.dissipationFrequency, 'Hz')}` : ''}`);
  if (r.esrMax != null) out.push(`ESR ≤ ${formatValue(r.esrMax, 'Ω')}`);
  if (r.inductanceNominal != null)
    out.push(`L ${formatValue(r.inductanceNominal, 'H')}${r.inductanceTolerancePct ? ` ±${r.inductanceTolerancePct} %` : ''}`);
  else if (r.inductanceTolerancePct != null) out.push(`L ±${r.inductanceTolerancePct} %`);
  if (r.minQ != null) out.push(`Q ≥ ${r.minQ}`);
  return out;
}

export function ProfilesBlock() {
  const canWrite = useCan('qa');
  const profiles = useProfiles();
  const [editing, setEditing] = useState<Profile | 'new' | null>(null);
  if (profiles.isPending) return <Loading what="Loading profiles" />;
  if (profiles.isError) return <Alert>{profiles.error.message}</Alert>;
  const range = (p: Profile) => {
    const u = QUANTITY_UNIT[NOMINAL_QUANTITY[p.kind]];
    if (p.nominalMin == null && p.nominalMax == null) return 'any';
    return `${p.nominalMin != null ? formatValue(p.nominalMin, u) : '…'} – ${p.nominalMax != null ? formatValue(p.nominalMax, u) : '…'}`;
  };
  return (
    <div className="space-y-4">
      <p className="text-sm text-ink-soft">
        A part follows the profile it names, else the most specific profile of its kind whose nominal range (and, for pots, law) fits it. A
        part’s own tolerance wins for its nominal value.
      </p>
      <div className="overflow-x-auto">
        <table className="w-full min-w-[680px] border-collapse text-sm">
          <caption className="sr-only">Tolerance profiles</caption>
          <thead>
            <tr className="border-b border-paper-edge text-left text-xs uppercase tracking-wide text-ink-soft">
              <th scope="col" className="py-2 pr-3 font-medium">
                Name
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Kind
              </th>
              <th scope="col" className="py-2 pr-3 text-right font-medium">
                Nominal range
              </th>
              <th scope="col" className="py-2 pr-3 text-right font-medium">
                Tolerance
              </th>
              <th scope="col" className="py-2 pr-3 font-medium">
                Rules
              </th>
              {canWrite && (
                <th scope="col" className="py-2 font-medium">
                  <span className="sr-only">Actions</span>
                </th>
              )}
            </tr>
          </thead>
          <tbody>
            {profiles.data.profiles.map((p) => (
              <tr key={p.id} className="border-b border-paper-edge/70 align-top last:border-0">
                <td className="py-2 pr-3 font-medium">{p.name}</td>
                <td className="py-2 pr-3">{KIND_LABEL[p.kind]}</td>
                <td className="num py-2 pr-3 text-right">{range(p)}</td>
                <td className="num py-2 pr-3 text-right">{formatTolerance(p.tolerancePct)}</td>
                <td className="py-2 pr-3 text-ink-soft">{rulesWords(p).join(' · ') || '—'}</td>
                {canWrite && (
                  <td className="py-1 text-right">
                    <Button size="sm" variant="quiet" onClick={() => setEditing(p)} aria-label={`Edit ${p.name}`}>
                      Edit
                    </Button>
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {canWrite &&
        (editing ? (
          <ProfileForm
            key={editing === 'new' ? 'new' : editing.id}
            profile={editing === 'new' ? undefined : editing}
            onDone={() => setEditing(null)}
          />
        ) : (
          <Button onClick={() => setEditing('new')}>New profile…</Button>
        ))}
    </div>
  );
}
