// The part values of the design, grouped as a tech thinks of them, in engineering notation. Every
// field shows how it was read ("reads as 22 nF"), its error in words, or the measured part it came
// from. Only the fields the chosen wiring uses are shown.
import { memo, useState, type Dispatch, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { PICKUP_PRESETS, type HarnessValueField, type HarnessValues } from '@shared/circuit/presets';
import { TAPER_LAW_LABEL, TAPER_LAWS, taperLaw, type TaperLawKind } from '@shared/taper/law';
import { SelectField, TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { paths } from '@/config/paths';
import { formatDate } from '@/lib/format';
import { usePartLabel } from '../api/get-measured-parts';
import {
  describeValue,
  fieldsFor,
  parseField,
  type DesignAction,
  type DesignState,
  type LawKey,
  type NumericKey,
  type PartRef,
} from './design-state';
import { MeasuredPickupPicker, MeasuredPotPicker } from './measured-pickers';

const EXAMPLES: Record<string, string> = {
  resistance: 'e.g. 500k, 4k7, 1meg',
  capacitance: 'e.g. 22n, 2n2, 470p',
  inductance: 'e.g. 4.4, 2500m',
  length: 'metres, e.g. 3',
  'capacitance-per-length': 'per metre, e.g. 100p',
};

function RefName({ partRef }: { partRef: PartRef }) {
  const fetched = usePartLabel(partRef.label ? undefined : partRef.partId);
  const label = partRef.label ?? fetched ?? `part ${partRef.partId}`;
  return (
    <Link to={paths.app.part.getHref(partRef.partId)} className="font-medium text-accent underline underline-offset-2">
      {label}
    </Link>
  );
}

function ValueField({ field, state, dispatch }: { field: HarnessValueField; state: DesignState; dispatch: Dispatch<DesignAction> }) {
  const key = field.key as NumericKey;
  const text = state.texts[key] ?? '';
  const error = state.errors[key];
  const ref = state.refs[key];
  const parsed = parseField(field, text);
  // "Reads as" only when the text is not already written the way Lugbook writes the value.
  const shown = describeValue(key, state.values);
  const hint: ReactNode = ref ? (
    <span>
      From <RefName partRef={ref} />
    </span>
  ) : parsed.ok && parsed.value !== undefined ? (
    text.trim() === shown ? undefined : (
      <span>
        Reads as <span className="num text-ink">{shown}</span>
      </span>
    )
  ) : field.optional ? (
    'Leave empty for none'
  ) : (
    EXAMPLES[field.quantity]
  );
  return (
    <TextField
      label={field.label}
      value={text}
      onChange={(e) => dispatch({ type: 'text', key, text: e.currentTarget.value })}
      autoComplete="off"
      spellCheck={false}
      inputClassName="num"
      placeholder={field.optional ? 'none' : undefined}
      hint={hint}
      error={error}
    />
  );
}

function LawField({ field, state, dispatch }: { field: HarnessValueField; state: DesignState; dispatch: Dispatch<DesignAction> }) {
  const key = field.key as LawKey;
  const law = state.values[key];
  const midKey = `${key}.m`;
  const ref = state.refs[key];
  return (
    <div className="grid grid-cols-[minmax(0,1fr)_7rem] gap-2">
      <SelectField
        label={field.label}
        value={law.kind}
        onChange={(e) => dispatch({ type: 'law-kind', key, kind: e.currentTarget.value as TaperLawKind })}
        hint={
          ref ? (
            <span>
              From <RefName partRef={ref} />
            </span>
          ) : undefined
        }
      >
        {TAPER_LAWS.map((k) => (
          <option key={k} value={k}>
            {TAPER_LAW_LABEL[k]}
          </option>
        ))}
      </SelectField>
      {law.kind !== 'linear' ? (
        <TextField
          label="At mid (%)"
          value={state.texts[midKey] ?? ''}
          onChange={(e) => dispatch({ type: 'law-mid', key, text: e.currentTarget.value })}
          inputMode="decimal"
          autoComplete="off"
          inputClassName="num"
          hint="Track share at knob 5"
          error={state.errors[midKey]}
        />
      ) : (
        <TextField label="At mid (%)" value="50" readOnly inputClassName="num" hint="Fixed for linear" />
      )}
    </div>
  );
}

function Group({ title, children, aside }: { title: string; children: ReactNode; aside?: ReactNode }) {
  return (
    <fieldset className="min-w-0 space-y-3 rounded-md border border-paper-edge p-3">
      <legend className="px-1 text-sm font-semibold">{title}</legend>
      {aside}
      {children}
    </fieldset>
  );
}

/** "Values from PU-012 (coil fit, 3 Jun 2026) · Type your own" for a group fed by a measured part. */
function LinkedNote({
  partRef,
  keys,
  dispatch,
}: {
  partRef: PartRef | undefined;
  keys: (keyof HarnessValues)[];
  dispatch: Dispatch<DesignAction>;
}) {
  if (!partRef) return null;
  return (
    <p className="flex flex-wrap items-center gap-x-2 gap-y-1 rounded bg-accent-tint px-2 py-1.5 text-xs text-accent-strong">
      <span>
        Measured: <RefName partRef={partRef} />
        {partRef.source ? ` (${partRef.source})` : ''}
      </span>
      <button type="button" className="underline underline-offset-2" onClick={() => dispatch({ type: 'detach', keys })}>
        Unlink
      </button>
    </p>
  );
}

const PICKUP_KEYS: (keyof HarnessValues)[] = ['pickupR', 'pickupL', 'pickupC', 'pickupRp'];

function pickupChoice(state: DesignState): string {
  if (state.refs.pickupL || state.refs.pickupR) return 'measured';
  const v = state.values;
  const typical = PICKUP_PRESETS.find(
    (p) => p.values.pickupR === v.pickupR && p.values.pickupL === v.pickupL && p.values.pickupC === v.pickupC && v.pickupRp === undefined,
  );
  return typical?.id ?? 'typed';
}

function PickupGroup({ state, dispatch, fields }: { state: DesignState; dispatch: Dispatch<DesignAction>; fields: HarnessValueField[] }) {
  const [wantMeasured, setWantMeasured] = useState(false);
  const choice = pickupChoice(state);
  const shown = wantMeasured && choice !== 'measured' ? 'measured' : choice;
  return (
    <Group title="Pickup" aside={<LinkedNote partRef={state.refs.pickupL ?? state.refs.pickupR} keys={PICKUP_KEYS} dispatch={dispatch} />}>
      <SelectField
        label="Pickup model"
        value={shown}
        onChange={(e) => {
          const v = e.currentTarget.value;
          if (v === 'measured') return setWantMeasured(true);
          setWantMeasured(false);
          const p = PICKUP_PRESETS.find((x) => x.id === v);
          if (p) dispatch({ type: 'apply', values: p.values, clearRp: p.values.pickupRp === undefined });
        }}
      >
        {PICKUP_PRESETS.map((p) => (
          <option key={p.id} value={p.id}>
            {p.name}, typical values
          </option>
        ))}
        <option value="measured">{choice === 'measured' ? 'Measured pickup (named above)' : 'A measured pickup…'}</option>
        {choice === 'typed' && <option value="typed">Typed values</option>}
      </SelectField>
      {wantMeasured && (
        <MeasuredPickupPicker
          onPick={(p) => {
            setWantMeasured(false);
            dispatch({
              type: 'apply',
              values: { pickupR: p.coil.R, pickupL: p.coil.L, pickupC: p.coil.C, ...(p.coil.Rp ? { pickupRp: p.coil.Rp } : {}) },
              clearRp: !p.coil.Rp,
              ref: { partId: p.part.id, label: p.part.label, source: `coil fit of ${formatDate(p.fit.createdAt)}` },
            });
          }}
        />
      )}
      {fields.map((f) => (
        <ValueField key={f.key} field={f} state={state} dispatch={dispatch} />
      ))}
    </Group>
  );
}

function PotGroup({
  which,
  state,
  dispatch,
  fields,
}: {
  which: 'volume' | 'tone';
  state: DesignState;
  dispatch: Dispatch<DesignAction>;
  fields: HarnessValueField[];
}) {
  const [open, setOpen] = useState(false);
  const rKey = which === 'volume' ? 'volumeR' : 'toneR';
  const lawKey = which === 'volume' ? 'volumeLaw' : 'toneLaw';
  return (
    <Group
      title={which === 'volume' ? 'Volume pot' : 'Tone pot'}
      aside={<LinkedNote partRef={state.refs[rKey] ?? state.refs[lawKey]} keys={[rKey, lawKey]} dispatch={dispatch} />}
    >
      {fields.map((f) =>
        f.quantity === 'law' ? (
          <LawField key={f.key} field={f} state={state} dispatch={dispatch} />
        ) : (
          <ValueField key={f.key} field={f} state={state} dispatch={dispatch} />
        ),
      )}
      {open ? (
        <MeasuredPotPicker
          which={which}
          onPick={(p) => {
            setOpen(false);
            dispatch({
              type: 'apply',
              values: { [rKey]: p.taper.total, [lawKey]: taperLaw(p.taper.law, p.taper.m) },
              ref: { partId: p.part.id, label: p.part.label, source: `taper fit of ${formatDate(p.fit.createdAt)}` },
            });
          }}
        />
      ) : (
        <Button size="sm" variant="quiet" onClick={() => setOpen(true)}>
          Use a measured pot…
        </Button>
      )}
    </Group>
  );
}

/** Memoised: a knob change re-renders the screen but leaves the editor alone. */
export const ValuesEditor = memo(function ValuesEditor({ state, dispatch }: { state: DesignState; dispatch: Dispatch<DesignAction> }) {
  const used = fieldsFor(state.preset);
  const pick = (...keys: (keyof HarnessValues)[]) => used.filter((f) => keys.includes(f.key));
  const network = pick('toneC', 'bleedC', 'bleedR', 'floorR', 'secondC');
  return (
    <div className="grid gap-4 md:grid-cols-2 xl:grid-cols-3">
      <PickupGroup state={state} dispatch={dispatch} fields={pick('pickupR', 'pickupL', 'pickupC', 'pickupRp')} />
      <PotGroup which="volume" state={state} dispatch={dispatch} fields={pick('volumeR', 'volumeLaw')} />
      <PotGroup which="tone" state={state} dispatch={dispatch} fields={pick('toneR', 'toneLaw')} />
      <Group title={network.length > 1 ? 'Tone network and treble bleed' : 'Tone capacitor'}>
        {network.map((f) => (
          <ValueField key={f.key} field={f} state={state} dispatch={dispatch} />
        ))}
      </Group>
      <Group title="Cable and amplifier">
        {pick('cableCapPerMetre', 'cableLength', 'ampR').map((f) => (
          <ValueField key={f.key} field={f} state={state} dispatch={dispatch} />
        ))}
      </Group>
    </div>
  );
});
