// Bench: the quick-measure screen. Keyboard first: type or scan a label (or the part page address
// from the printed QR code) and press Enter; the value field takes focus; type the reading, watch the
// verdict, press Enter to save; Esc goes back to the part search.
import { useQueryClient } from '@tanstack/react-query';
import { useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import type { Part } from '@shared/schemas/parts';
import { useInstruments } from '@/data/instruments';
import { useProfiles } from '@/data/profiles';
import { chooseProfile } from '@shared/analysis/profile-match';
import { ReadingForm } from '@/components/readings/reading-form';
import { BenchSafetyNote } from '@/components/safety/safety-notes';
import { Alert, Loading } from '@/components/ui/alert';
import { StatusBadge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { PageHeader, Panel } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useCan } from '@/lib/auth';
import { formatNominal, formatTolerance } from '@/lib/format';
import { findPartQueryOptions, readScan } from '../api/find-part';
import { QuickPartForm } from './quick-part-form';
import { RecentReadings } from './recent-readings';

const KIND_WORD = { pot: 'Pot', capacitor: 'Capacitor', resistor: 'Resistor', pickup: 'Pickup', other: 'Other' } as const;

type Lookup = { state: 'idle' } | { state: 'busy' } | { state: 'missing'; label: string } | { state: 'error'; message: string };

export function BenchScreen() {
  const queryClient = useQueryClient();
  const canWrite = useCan('write');
  const profiles = useProfiles();
  const instruments = useInstruments();
  const [part, setPart] = useState<Part | null>(null);
  const [lookup, setLookup] = useState<Lookup>({ state: 'idle' });
  const [creating, setCreating] = useState<string | null>(null);
  const search = useRef<HTMLInputElement>(null);

  const backToSearch = () => {
    search.current?.focus();
    search.current?.select();
  };

  const onFind = async (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const text = search.current?.value ?? '';
    const scan = readScan(text);
    setCreating(null);
    if (!scan) {
      setLookup({ state: 'error', message: 'Type or scan a part label, e.g. P-0142.' });
      return;
    }
    setLookup({ state: 'busy' });
    try {
      const found = await queryClient.fetchQuery(findPartQueryOptions(scan));
      setPart(found);
      setLookup({ state: 'idle' });
      if (search.current) search.current.value = found.label;
    } catch (err) {
      if (isApiError(err) && err.status === 404) {
        setPart(null);
        setLookup({ state: 'missing', label: 'label' in scan ? scan.label : '' });
      } else {
        setLookup({ state: 'error', message: err instanceof Error ? err.message : 'The part could not be looked up.' });
      }
    }
  };

  const profile = part && profiles.data ? chooseProfile(profiles.data.profiles, part) : null;

  return (
    <div>
      <PageHeader title="Bench" description="Quick measure: find a part, type the reading, see the verdict before you save." />
      <div className="grid gap-6 lg:grid-cols-3">
        <div className="space-y-6 lg:col-span-2">
          <Panel id="bench-find" title="1 · Part">
            <form onSubmit={onFind} role="search" aria-label="Find a part by label" className="flex flex-wrap items-end gap-2">
              <TextField
                ref={search}
                label="Label or scanned code"
                className="min-w-0 flex-1"
                inputClassName="num text-lg sm:text-lg"
                autoComplete="off"
                spellCheck={false}
                autoFocus
                placeholder="P-0142"
                hint="A scanner may give the label or the part page address; both work."
                error={lookup.state === 'error' ? lookup.message : undefined}
              />
              <Button type="submit" variant="primary" busy={lookup.state === 'busy'} busyText="Finding…" className="mb-5">
                Find
              </Button>
            </form>

            {lookup.state === 'missing' && creating === null && (
              <div
                className="mt-3 flex flex-wrap items-center gap-3 rounded-md border border-paper-edge bg-paper-deep/50 p-3 text-sm"
                role="status"
              >
                <span>
                  No part is labelled <span className="num font-medium">{lookup.label || 'that'}</span>.
                </span>
                {canWrite && (
                  <Button size="sm" variant="primary" autoFocus onClick={() => setCreating(lookup.label)}>
                    Create it here
                  </Button>
                )}
              </div>
            )}
            {creating !== null && canWrite && (
              <div className="mt-4 border-t border-paper-edge pt-4">
                <QuickPartForm
                  label={creating}
                  onCreated={(p) => {
                    setCreating(null);
                    setLookup({ state: 'idle' });
                    setPart(p);
                    if (search.current) search.current.value = p.label;
                  }}
                  onCancel={() => {
                    setCreating(null);
                    backToSearch();
                  }}
                />
              </div>
            )}

            {part && (
              <div className="mt-4 flex flex-wrap items-center gap-x-5 gap-y-2 rounded-md border border-paper-edge bg-paper p-3 text-sm">
                <Link
                  to={paths.app.part.getHref(part.id)}
                  className="num text-base font-semibold text-accent underline-offset-2 hover:underline"
                >
                  {part.label}
                </Link>
                <span>{KIND_WORD[part.kind]}</span>
                <span className="num">{formatNominal(part.kind, part.nominal)}</span>
                <span className="num">{formatTolerance(part.tolerancePct, part.tolerancePlusPct)}</span>
                <StatusBadge status={part.status} reason={part.statusReason} />
                <span className="text-ink-soft">{profile ? `Profile: ${profile.name}` : 'No profile applies'}</span>
              </div>
            )}
          </Panel>

          {part && (
            <Panel id="bench-reading" title="2 · Reading">
              {!canWrite ? (
                <p className="text-sm text-ink-soft">Your role reads the records but does not add readings.</p>
              ) : profiles.isPending || instruments.isPending ? (
                <Loading what="Loading profiles and instruments" />
              ) : profiles.isError || instruments.isError ? (
                <Alert>{(profiles.error ?? instruments.error)?.message}</Alert>
              ) : (
                <div
                  // Catches Escape bubbling from the reading form's fields (back to the part search).
                  role="presentation"
                  onKeyDown={(e) => {
                    if (e.key === 'Escape') {
                      e.preventDefault();
                      backToSearch();
                    }
                  }}
                >
                  <ReadingForm
                    key={part.id}
                    part={part}
                    profiles={profiles.data.profiles}
                    instruments={instruments.data.instruments}
                    size="bench"
                    autoFocus
                    onSaved={(saved) => setPart(saved.part)}
                  />
                </div>
              )}
            </Panel>
          )}
        </div>
        <BenchSafetyNote className="self-start" />
      </div>

      <Panel id="bench-recent" title="Recent readings" className="mt-6">
        <RecentReadings />
      </Panel>
    </div>
  );
}
