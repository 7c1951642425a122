// The part values of the design, grouped as a tech thinks of them (each pickup or coil, each volume
// with its treble bleed, each tone with its network, the load), in engineering notation. Every
// field shows how it was read ("reads as 22 nF"), its error in words, or the measured part it came
// from. Only the fields the chosen layout and options use are shown. Pickups take a measured coil
// fit, pots a taper fit, every capacitor slot a capacitor's latest capacitance reading.
import { memo, useState, type Dispatch, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { LayoutDef, LayoutValueDef } from '@shared/circuit/layouts';
import { loadValueKeys, isLoadId, LOADS } from '@shared/circuit/loads';
import { slotPartKind } from '@shared/circuit/slots';
import { PICKUP_PRESETS } from '@shared/circuit/presets';
import { TAPER_LAW_LABEL, TAPER_LAWS, taperLaw, type TaperLaw, type TaperLawKind } from '@shared/taper/law';
import { SelectField, TextField } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { paths } from '@/config/paths';
import { formatDate } from '@/lib/format';
import { usePartLabel } from '../api/get-measured-parts';
import { defOf, describeValue, isUsed, layoutOf, parseField, type DesignAction, type DesignState, type PartRef } from './design-state';
import { MeasuredCapacitorPicker, MeasuredPickupPicker, MeasuredPotPicker } from './measured-pickers';

const EXAMPLES: Record<string, string> = {
  resistance: 'e.g. 500k, 4k7, 1meg',
  capacitance: 'e.g. 22n, 2n2, 470p',
  inductance: 'e.g. 4.4, 2500m',
  length: 'metres, e.g. 3',
  'capacitance-per-length': 'per metre, e.g. 100p',
};

const k = (prefix: string, name: string) => (prefix ? `${prefix}.${name}` : name);

function RefName({ partRef }: { partRef: PartRef }) {
  const fetched = usePartLabel(partRef.label ? undefined : partRef.partId);
  const label = partRef.label ?? fetched ?? `part ${partRef.partId}`;
  return (
    <Link to={paths.app.part.getHref(partRef.partId)} className="font-medium text-accent underline underline-offset-2">
      {label}
    </Link>
  );
}

/** A field's label without the group's name in front ("Neck: tone capacitor" → "Tone capacitor"). */
const shortLabel = (def: LayoutValueDef) => {
  const s = def.name.includes(': ') ? def.name.slice(def.name.indexOf(': ') + 2) : def.name;
  return s.charAt(0).toUpperCase() + s.slice(1);
};

function ValueField({ def, state, dispatch }: { def: LayoutValueDef; state: DesignState; dispatch: Dispatch<DesignAction> }) {
  const key = def.key;
  const text = state.texts[key] ?? '';
  const error = state.errors[key];
  const ref = state.refs[key];
  const parsed = parseField(def, text);
  const [picking, setPicking] = useState(false);
  // "Reads as" only when the text is not already written the way Lugbook writes the value.
  const shown = describeValue(def, state.values);
  const capacitorSlot = slotPartKind(key) === 'capacitor';
  const hint: ReactNode = ref ? (
    <span>
      From <RefName partRef={ref} />
      {ref.source ? ` (${ref.source})` : ''}{' '}
      <button type="button" className="underline underline-offset-2" onClick={() => dispatch({ type: 'detach', keys: [key] })}>
        Unlink
      </button>
    </span>
  ) : parsed.ok && parsed.value !== undefined ? (
    text.trim() === shown ? undefined : (
      <span>
        Reads as <span className="num text-ink">{shown}</span>
      </span>
    )
  ) : def.default === null ? (
    'Leave empty for none'
  ) : (
    EXAMPLES[def.quantity]
  );
  return (
    <div className="space-y-1">
      <TextField
        label={shortLabel(def)}
        value={text}
        onChange={(e) => dispatch({ type: 'text', key, text: e.currentTarget.value })}
        autoComplete="off"
        spellCheck={false}
        inputClassName="num"
        placeholder={def.default === null ? 'none' : undefined}
        hint={hint}
        error={error}
      />
      {capacitorSlot &&
        (picking ? (
          <MeasuredCapacitorPicker
            label={shortLabel(def).toLowerCase()}
            onPick={(c) => {
              setPicking(false);
              dispatch({
                type: 'apply',
                values: { [key]: c.reading.value },
                ref: { partId: c.part.id, label: c.part.label, source: `capacitance reading of ${formatDate(c.reading.takenAt)}` },
              });
            }}
          />
        ) : (
          <Button size="sm" variant="quiet" onClick={() => setPicking(true)}>
            Use a measured capacitor…
          </Button>
        ))}
    </div>
  );
}

function LawField({ def, state, dispatch }: { def: LayoutValueDef; state: DesignState; dispatch: Dispatch<DesignAction> }) {
  const key = def.key;
  const law = state.values[key] as TaperLaw;
  const midKey = `${key}.m`;
  return (
    <div className="grid grid-cols-[minmax(0,1fr)_7rem] gap-2">
      <SelectField
        label={shortLabel(def)}
        value={law.kind}
        onChange={(e) => dispatch({ type: 'law-kind', key, kind: e.currentTarget.value as TaperLawKind })}
      >
        {TAPER_LAWS.map((l) => (
          <option key={l} value={l}>
            {TAPER_LAW_LABEL[l]}
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

function Field({ def, state, dispatch }: { def: LayoutValueDef; state: DesignState; dispatch: Dispatch<DesignAction> }) {
  return def.quantity === 'law' ? (
    <LawField def={def} state={state} dispatch={dispatch} />
  ) : (
    <ValueField def={def} state={state} dispatch={dispatch} />
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

/** "Measured: PU-012 (coil fit, 3 Jun 2026) · Unlink" for a group fed by a measured part. */
function LinkedNote({ partRef, keys, dispatch }: { partRef: PartRef | undefined; keys: string[]; dispatch: Dispatch<DesignAction> }) {
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

function PickupGroup({
  prefix,
  title,
  state,
  dispatch,
}: {
  prefix: string;
  title: string;
  state: DesignState;
  dispatch: Dispatch<DesignAction>;
}) {
  const layout = layoutOf(state);
  const keys = ['pickupR', 'pickupL', 'pickupC', 'pickupRp'].map((n) => k(prefix, n));
  const defs = keys.map((key) => defOf(layout, key)).filter((d): d is LayoutValueDef => !!d && isUsed(state, d.key));
  const [wantMeasured, setWantMeasured] = useState(false);
  const measured = !!(state.refs[keys[1]!] ?? state.refs[keys[0]!]);
  const v = state.values;
  // the typical pickups of the presets apply where the layout's pickup is a whole pickup (not one coil)
  const typical = prefix === 'north' || prefix === 'south' ? [] : PICKUP_PRESETS;
  const chosenTypical = typical.find(
    (p) =>
      p.values.pickupR === v[keys[0]!] && p.values.pickupL === v[keys[1]!] && p.values.pickupC === v[keys[2]!] && v[keys[3]!] === undefined,
  );
  const choice = measured ? 'measured' : (chosenTypical?.id ?? 'typed');
  const shown = wantMeasured && !measured ? 'measured' : choice;
  if (defs.length === 0) return null;
  return (
    <Group title={title} aside={<LinkedNote partRef={state.refs[keys[1]!] ?? state.refs[keys[0]!]} keys={keys} dispatch={dispatch} />}>
      <SelectField
        label={title === 'Pickup' ? 'Pickup model' : `${title} model`}
        value={shown}
        onChange={(e) => {
          const id = e.currentTarget.value;
          if (id === 'measured') return setWantMeasured(true);
          setWantMeasured(false);
          const p = typical.find((x) => x.id === id);
          if (p)
            dispatch({
              type: 'apply',
              values: { [keys[0]!]: p.values.pickupR, [keys[1]!]: p.values.pickupL, [keys[2]!]: p.values.pickupC },
              clear: p.values.pickupRp === undefined ? [keys[3]!] : [],
            });
        }}
      >
        {typical.map((p) => (
          <option key={p.id} value={p.id}>
            {p.name}, typical values
          </option>
        ))}
        <option value="measured">{measured ? 'Measured pickup (named above)' : 'A measured pickup…'}</option>
        {choice === 'typed' && <option value="typed">Typed values</option>}
      </SelectField>
      {wantMeasured && (
        <MeasuredPickupPicker
          onPick={(p) => {
            setWantMeasured(false);
            dispatch({
              type: 'apply',
              values: {
                [keys[0]!]: p.coil.R,
                [keys[1]!]: p.coil.L,
                [keys[2]!]: p.coil.C,
                ...(p.coil.Rp ? { [keys[3]!]: p.coil.Rp } : {}),
              },
              clear: p.coil.Rp ? [] : [keys[3]!],
              ref: { partId: p.part.id, label: p.part.label, source: `coil fit of ${formatDate(p.fit.createdAt)}` },
            });
          }}
        />
      )}
      {defs.map((d) => (
        <Field key={d.key} def={d} state={state} dispatch={dispatch} />
      ))}
    </Group>
  );
}

/** A pot with what hangs on it: a volume with its treble bleed, a tone with its capacitor network. */
function PotGroup({
  which,
  prefix,
  title,
  state,
  dispatch,
}: {
  which: 'volume' | 'tone';
  prefix: string;
  title: string;
  state: DesignState;
  dispatch: Dispatch<DesignAction>;
}) {
  const layout = layoutOf(state);
  const [open, setOpen] = useState(false);
  const rKey = k(prefix, which === 'volume' ? 'volumeR' : 'toneR');
  const lawKey = k(prefix, which === 'volume' ? 'volumeLaw' : 'toneLaw');
  const names = which === 'volume' ? ['volumeR', 'volumeLaw', 'bleedC', 'bleedR'] : ['toneR', 'toneLaw', 'toneC', 'floorR', 'secondC'];
  const defs = names.map((n) => defOf(layout, k(prefix, n))).filter((d): d is LayoutValueDef => !!d && isUsed(state, d.key));
  if (!defOf(layout, rKey)) return null;
  return (
    <Group title={title} aside={<LinkedNote partRef={state.refs[rKey] ?? state.refs[lawKey]} keys={[rKey, lawKey]} dispatch={dispatch} />}>
      {defs
        .filter((d) => d.key === rKey || d.key === lawKey)
        .map((d) => (
          <Field key={d.key} def={d} state={state} dispatch={dispatch} />
        ))}
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
      {defs
        .filter((d) => d.key !== rKey && d.key !== lawKey)
        .map((d) => (
          <Field key={d.key} def={d} state={state} dispatch={dispatch} />
        ))}
    </Group>
  );
}

/** The value prefix of a knob: `neck.volume` → `neck`, `volume` → ``, `tone1` → `tone1`. */
function knobPrefix(layout: LayoutDef, knobId: string, which: 'volume' | 'tone'): string {
  const stripped = knobId.replace(which === 'volume' ? /\.?volume$/ : /\.?tone$/, '');
  return defOf(layout, k(stripped, which === 'volume' ? 'volumeR' : 'toneR')) ? stripped : knobId;
}

/** Memoised: a knob change re-renders the screen but leaves the editor alone. */
export const ValuesEditor = memo(function ValuesEditor({ state, dispatch }: { state: DesignState; dispatch: Dispatch<DesignAction> }) {
  const layout = layoutOf(state);
  const load = isLoadId(state.options.load) ? state.options.load : 'amp';
  const coilPickups = layout.pickups.flatMap((p) =>
    p.coils.length > 0
      ? p.coils.map((c) => ({ prefix: c.id, title: `${p.name}: ${c.name} coil` }))
      : [{ prefix: layout.id === 'one-pickup' ? '' : p.id, title: layout.pickups.length > 1 ? `${p.name} pickup` : 'Pickup' }],
  );
  const volumes = layout.knobs.filter((kn) => /(^|\.)volume$/.test(kn.id));
  const tones = layout.knobs.filter((kn) => /(^|\.)tone\d*$/.test(kn.id));
  return (
    <div className="grid gap-4 md:grid-cols-2 xl:grid-cols-3">
      {coilPickups.map((p) => (
        <PickupGroup key={p.prefix} prefix={p.prefix} title={p.title} state={state} dispatch={dispatch} />
      ))}
      {volumes.map((kn) => (
        <PotGroup
          key={kn.id}
          which="volume"
          prefix={knobPrefix(layout, kn.id, 'volume')}
          title={`${kn.name} pot${state.options.bleed && state.options.bleed !== 'none' ? ' and treble bleed' : ''}`}
          state={state}
          dispatch={dispatch}
        />
      ))}
      {tones.map((kn) => (
        <PotGroup
          key={kn.id}
          which="tone"
          prefix={knobPrefix(layout, kn.id, 'tone')}
          title={`${kn.name} pot and capacitor`}
          state={state}
          dispatch={dispatch}
        />
      ))}
      <Group title={`Cable and ${LOADS[load].name.toLowerCase()}`}>
        {loadValueKeys(load).map((key) => {
          const d = defOf(layout, key)!;
          return <Field key={key} def={d} state={state} dispatch={dispatch} />;
        })}
      </Group>
    </div>
  );
});
