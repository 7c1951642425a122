// Pots whose loaded tapers agree within a tolerance over the whole knob travel: what a builder
// needs for two (or more) volume controls that track.
import { useMemo, useState } from 'react';
import { matchLoadedTapers } from '@shared/analysis/compare';
import { CompareSettingsSchema, type CompareSettings } from '@shared/schemas/compare';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { downloadCsv } from '@/lib/download';
import type { Condition } from '@shared/csv/conditions';
import type { TaperPot } from '../api/types';
import type { PotLoaded } from './compare-model';

type MatchSettings = Pick<CompareSettings, 'toleranceDb' | 'setSize' | 'floorDb'>;

export function Matching({
  loaded,
  settings,
  onChange,
  groupLabel,
  conditions,
}: {
  loaded: PotLoaded[];
  settings: MatchSettings;
  onChange: (s: Partial<CompareSettings>) => void;
  groupLabel: (p: TaperPot) => string;
  conditions: Condition[];
}) {
  const [tolText, setTolText] = useState(String(settings.toleranceDb));
  const [tolError, setTolError] = useState<string>();
  const sets = useMemo(
    () =>
      matchLoadedTapers(
        loaded.map((l) => l.taper.relativeDb),
        { toleranceDb: settings.toleranceDb, setSize: settings.setSize, floorDb: settings.floorDb },
      ),
    [loaded, settings.toleranceDb, settings.setSize, settings.floorDb],
  );
  const matched = sets.reduce((n, s) => n + s.indices.length, 0);

  const commitTol = (text: string) => {
    setTolText(text);
    const n = Number(text.replace(',', '.').replace(/\s*dB$/i, ''));
    const check = CompareSettingsSchema.shape.toleranceDb.safeParse(text.trim() === '' ? Number.NaN : n);
    if (!check.success)
      return setTolError(
        Number.isNaN(n) || text.trim() === '' ? 'Type the tolerance in dB, e.g. 0.5 or 1.' : check.error.issues[0]!.message,
      );
    setTolError(undefined);
    onChange({ toleranceDb: check.data });
  };

  const setName = settings.setSize === 2 ? 'pairs' : `sets of ${settings.setSize}`;
  return (
    <div>
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField
          label="Tolerance (dB)"
          inputMode="decimal"
          value={tolText}
          onChange={(e) => commitTol(e.target.value)}
          error={tolError}
          hint="Largest difference anywhere on the knob"
          inputClassName="num"
        />
        <SelectField label="Set size" value={settings.setSize} onChange={(e) => onChange({ setSize: Number(e.target.value) })}>
          {[2, 3, 4, 5, 6].map((n) => (
            <option key={n} value={n}>
              {n === 2 ? 'Pairs (2)' : `${n} pots`}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Ignore levels below"
          value={settings.floorDb}
          onChange={(e) => onChange({ floorDb: Number(e.target.value) })}
          hint="Near the end stop the level falls away; nobody hears it"
        >
          {[-30, -40, -50, -60].map((n) => (
            <option key={n} value={n}>
              {n} dB
            </option>
          ))}
        </SelectField>
      </div>
      <div className="mt-4 flex flex-wrap items-center justify-between gap-2">
        <p className="text-sm text-ink" aria-live="polite">
          <span className="num">{sets.length}</span> {setName} found; <span className="num">{loaded.length - matched}</span> of{' '}
          <span className="num">{loaded.length}</span> pots left unmatched.
        </p>
        <Button
          size="sm"
          disabled={sets.length === 0}
          onClick={() =>
            downloadCsv(
              sets.flatMap((s, k) =>
                s.indices.map((i) => ({
                  set: `M${k + 1}`,
                  part: loaded[i]!.pot.label,
                  group: groupLabel(loaded[i]!.pot),
                  set_spread_db: Number(s.spreadDb.toFixed(4)),
                })),
              ),
              'matched-sets.csv',
              [
                ...conditions,
                { key: 'match tolerance', value: `${settings.toleranceDb} dB` },
                { key: 'set size', value: settings.setSize },
                { key: 'level floor', value: `${settings.floorDb} dB` },
              ],
            )
          }
        >
          Sets as CSV
        </Button>
      </div>
      {sets.length > 0 ? (
        <ol className="mt-3 grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
          {sets.map((s, k) => (
            <li key={s.indices.join('-')} className="rounded-md border border-paper-edge bg-paper px-3 py-2 text-sm">
              <div className="flex items-baseline justify-between gap-2">
                <span className="font-semibold">M{k + 1}</span>
                <span className="num text-ink-soft">within {s.spreadDb.toFixed(2)} dB</span>
              </div>
              <p className="mt-0.5">{s.indices.map((i) => loaded[i]!.pot.label).join(' + ')}</p>
            </li>
          ))}
        </ol>
      ) : (
        <p className="mt-3 rounded-md border border-dashed border-paper-edge px-3 py-2 text-sm text-ink-soft">
          No {setName} agree within {settings.toleranceDb} dB. Widen the tolerance or add pots to the selection.
        </p>
      )}
      <p className="mt-3 text-xs text-ink-soft">
        Two pots match when their loaded levels differ by at most the tolerance at every knob setting from 0 to 10 in steps of 0.1, with
        levels below the floor counted as the floor. Sets are taken greedily, tightest first, so each set is the closest still available; it
        does not promise the largest possible number of sets.
      </p>
    </div>
  );
}
