// Compare (docs/screens.md, Compare): "how do the pots of these lots really behave, and what does the
// player hear?" Opens on every pot with a sweep, grouped by lot, so the study starts at once.
import { useEffect, useMemo, useRef, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import type { GroupBy } from '@shared/analysis/compare';
import {
  CABLE_CAPACITANCE_PER_METRE,
  DEFAULT_COMPARE_SETTINGS,
  type CompareSelection,
  type CompareSettings,
} from '@shared/schemas/compare';
import { Alert, Loading } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { PageHeader, Panel } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { downloadCsv } from '@/lib/download';
import type { Condition } from '@shared/csv/conditions';
import { formatValue } from '@shared/units/format';
import { useCompareCandidates } from '../api/get-candidates';
import { useComparison } from '../api/get-comparisons';
import { useCompareTapers } from '../api/get-tapers';
import type { TaperPot } from '../api/types';
import { curveRows, groupColours, loadedTapers, pickupModel } from './compare-model';
import { LoadControls, LoadedChart, LoadedTable, MissingPickup } from './loaded-taper';
import { Matching } from './matching';
import { SavedStudies } from './saved-studies';
import { describeSelection, GroupByChooser, SelectionPanel } from './selection-panel';
import { GroupTable, PotTable } from './taper-tables';
import { TaperOverlay } from './taper-overlay';

export function studyIdFromSearch(search: URLSearchParams): number | null {
  const n = Number(search.get('study'));
  return Number.isInteger(n) && n > 0 ? n : null;
}

export function CompareScreen() {
  const [params, setParams] = useSearchParams();
  const studyId = studyIdFromSearch(params);
  const study = useComparison(studyId);
  const candidates = useCompareCandidates();
  const [selection, setSelection] = useState<CompareSelection>({});
  const [settings, setSettings] = useState<CompareSettings>(DEFAULT_COMPARE_SETTINGS);
  // Controls with typed text remount when a study is opened, so they show its values.
  const [formKey, setFormKey] = useState('new');
  const applied = useRef<string | null>(null);

  useEffect(() => {
    const s = study.data;
    if (!s) return;
    const key = `${s.id}:${s.updatedAt ?? s.createdAt}`;
    if (applied.current === key) return;
    applied.current = key;
    setSelection(s.selection);
    setSettings({ ...DEFAULT_COMPARE_SETTINGS, ...(s.settings ?? {}) });
    setFormKey(key);
  }, [study.data]);

  const openStudy = (id: number | null) => {
    const next = new URLSearchParams(params);
    if (id) next.set('study', String(id));
    else next.delete('study');
    setParams(next);
  };
  const change = (patch: Partial<CompareSettings>) => setSettings((s) => ({ ...s, ...patch }));
  const quickStart = () => {
    setSelection({});
    change({ groupBy: 'lot' });
  };

  const tapers = useCompareTapers({ selection, groupBy: settings.groupBy });
  const data = tapers.data;
  const colours = useMemo(() => groupColours(data?.groups ?? []), [data]);
  const groupLabel = useMemo(() => {
    const labels = new Map((data?.groups ?? []).map((g) => [g.key, g.label]));
    return (p: TaperPot) => labels.get(p.group) ?? '';
  }, [data]);
  const pickup = pickupModel(settings.pickup, candidates.data?.pickups ?? []);
  const loaded = useMemo(
    () => (data && pickup ? loadedTapers(data.pots, pickup.model, settings) : []),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- the pickup enters by its four model values, so an equal model fetched again does not recompute
    [data, pickup?.model.R, pickup?.model.L, pickup?.model.C, pickup?.model.Rp, settings.cableLength, settings.ampR],
  );

  const noSweepsAtAll = candidates.data && candidates.data.pots.length === 0;

  // What every export of this study states: the pots compared and how they are grouped; the loaded
  // curves add the pickup, cable and amplifier input they were computed with.
  const studyConditions: Condition[] = data
    ? [
        { key: 'pots compared', value: `${data.pots.length} in ${data.groups.length} ${data.groups.length === 1 ? 'group' : 'groups'}` },
        { key: 'selection', value: describeSelection(selection, candidates.data) },
        { key: 'grouped by', value: settings.groupBy },
        { key: 'left out (no current taper fit)', value: data.missing.length },
      ]
    : [];
  const loadConditions: Condition[] = [
    ...studyConditions,
    { key: 'pickup', value: pickup ? pickup.name : null },
    { key: 'cable', value: `${settings.cableLength} m at ${formatValue(CABLE_CAPACITANCE_PER_METRE, 'F')}/m` },
    { key: 'amplifier input', value: formatValue(settings.ampR, 'Ω') },
    { key: 'level', value: "at 1 kHz relative to full volume, computed with each pot's fitted law and measured total" },
  ];

  return (
    <div className="space-y-6">
      <PageHeader
        title="Compare"
        description="Overlay the measured tapers of pots by lot or supplier, hear each one as a volume control with a real pickup and load, and find pots that track."
      />

      <Panel title="Saved studies" id="compare-saved">
        <SavedStudies open={studyId ? (study.data ?? null) : null} selection={selection} settings={settings} onOpen={openStudy} />
        {study.isError && (
          <div className="mt-3">
            <Alert title="That study could not be opened">{study.error.message}</Alert>
          </div>
        )}
      </Panel>

      <Panel
        title="Selection"
        id="compare-selection"
        actions={
          <Button variant="primary" onClick={quickStart}>
            All pots with sweeps, by lot
          </Button>
        }
      >
        {candidates.isPending ? (
          <Loading what="Finding pots with sweeps" />
        ) : candidates.isError ? (
          <Alert>{candidates.error.message}</Alert>
        ) : noSweepsAtAll ? (
          <p className="text-sm text-ink-soft">
            No pot has a rotation sweep with a taper fit yet. Upload a sweep on a pot's page in{' '}
            <Link to={paths.app.parts.getHref({ kind: 'pot' })} className="text-accent underline">
              Parts
            </Link>{' '}
            and it appears here.
          </p>
        ) : (
          <div className="space-y-4">
            <div className="flex flex-wrap items-center justify-between gap-3 rounded-md bg-accent-tint px-3 py-2">
              <p className="text-sm text-accent-strong" aria-live="polite">
                {data ? (
                  <>
                    Comparing <span className="num font-semibold">{data.pots.length}</span> pots in{' '}
                    <span className="num font-semibold">{data.groups.length}</span> {data.groups.length === 1 ? 'group' : 'groups'}:{' '}
                    {describeSelection(selection, candidates.data)}
                    {tapers.isFetching ? ' (updating…)' : ''}
                  </>
                ) : (
                  'Loading the curves…'
                )}
              </p>
              <GroupByChooser value={settings.groupBy} onChange={(g: GroupBy) => change({ groupBy: g })} />
            </div>
            {data && data.missing.length > 0 && (
              <Alert tone="info">
                {data.missing.length} picked {data.missing.length === 1 ? 'part has' : 'parts have'} no current taper fit and{' '}
                {data.missing.length === 1 ? 'is' : 'are'} left out.
              </Alert>
            )}
            <SelectionPanel candidates={candidates.data} selection={selection} onChange={setSelection} />
          </div>
        )}
      </Panel>

      {tapers.isError && <Alert title="The curves could not be loaded">{tapers.error.message}</Alert>}

      {data && data.pots.length === 0 && !noSweepsAtAll && (
        <Alert tone="info" title="No pots match this selection">
          Loosen a filter, or start again with all pots with sweeps.
        </Alert>
      )}

      {data && data.pots.length > 0 && (
        <>
          <Panel
            title="Taper curves"
            id="compare-tapers"
            actions={
              <div className="flex flex-wrap items-center gap-3">
                <fieldset className="flex items-center gap-3 text-sm">
                  <legend className="sr-only">Envelope</legend>
                  {(
                    [
                      ['min-max', 'Min–max band'],
                      ['two-sd', '±2σ band'],
                    ] as const
                  ).map(([v, label]) => (
                    <label key={v} className="flex cursor-pointer items-center gap-1.5">
                      <input
                        type="radio"
                        name="compare-envelope"
                        className="size-4 accent-accent"
                        checked={settings.envelope === v}
                        onChange={() => change({ envelope: v })}
                      />
                      {label}
                    </label>
                  ))}
                </fieldset>
                <Button size="sm" onClick={() => downloadCsv(curveRows(data.grid, data.pots), 'taper-curves.csv', studyConditions)}>
                  Curves as CSV
                </Button>
              </div>
            }
          >
            <TaperOverlay data={data} colours={colours} envelope={settings.envelope} conditions={studyConditions} />
            <div className="mt-6 space-y-6">
              <GroupTable groups={data.groups} colours={colours} conditions={studyConditions} />
              <PotTable pots={data.pots} colours={colours} groupLabel={groupLabel} conditions={studyConditions} />
            </div>
          </Panel>

          <Panel title="Loaded taper: what the player hears" id="compare-loaded">
            <p className="mb-4 max-w-prose text-sm text-ink-soft">
              Each pot as the volume control: the pickup feeds lug 3, the wiper drives the cable (100 pF per metre) and the amplifier input.
              Level at 1 kHz, relative to full volume, from the harness engine with each pot's fitted law and measured total.
            </p>
            <LoadControls key={`load-${formKey}`} settings={settings} pickups={candidates.data?.pickups ?? []} onChange={change} />
            <div className="mt-5 space-y-6">
              {pickup ? (
                <>
                  <LoadedChart loaded={loaded} colours={colours} pickupName={pickup.name} conditions={loadConditions} />
                  <LoadedTable loaded={loaded} colours={colours} groupLabel={groupLabel} conditions={loadConditions} />
                </>
              ) : (
                <MissingPickup />
              )}
            </div>
          </Panel>

          {pickup && (
            <Panel title="Matching: pots that track" id="compare-matching">
              <Matching
                key={`match-${formKey}`}
                loaded={loaded}
                settings={settings}
                onChange={change}
                groupLabel={groupLabel}
                conditions={loadConditions}
              />
            </Panel>
          )}
        </>
      )}
    </div>
  );
}
