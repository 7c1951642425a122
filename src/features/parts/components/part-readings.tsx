import { useInstruments } from '@/data/instruments';
import { useProfiles } from '@/data/profiles';
import type { Reading } from '@/data/readings';
import { OverdueMark } from '@/components/readings/overdue-mark';
import { chooseProfile } from '@shared/analysis/profile-match';
import { ReadingForm } from '@/components/readings/reading-form';
import { BenchSafetyNote } from '@/components/safety/safety-notes';
import { QUANTITY_NAME, formatReading } from '@/components/readings/words';
import { Alert, Loading } from '@/components/ui/alert';
import { VerdictBadge } from '@/components/ui/badge';
import { useCan } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { formatValue } from '@shared/units/format';
import { usePartReadings } from '../api/get-readings';
import type { PartDetail } from '@shared/schemas/parts';

function ReadingRows({ readings }: { readings: Reading[] }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full min-w-[600px] border-collapse text-sm">
        <caption className="sr-only">Readings of this part, newest first</caption>
        <thead>
          <tr className="border-b border-paper-edge text-left text-xs uppercase tracking-wide text-ink-soft">
            <th scope="col" className="py-2 pr-3 font-medium">
              Quantity
            </th>
            <th scope="col" className="py-2 pr-3 text-right font-medium">
              Value
            </th>
            <th scope="col" className="py-2 pr-3 text-right font-medium">
              Test freq.
            </th>
            <th scope="col" className="py-2 pr-3 font-medium">
              Verdict and reason
            </th>
            <th scope="col" className="py-2 pr-3 font-medium">
              Instrument
            </th>
            <th scope="col" className="py-2 font-medium">
              Who, when
            </th>
          </tr>
        </thead>
        <tbody>
          {readings.map((r) => (
            <tr key={r.id} className="border-b border-paper-edge/70 align-top last:border-0">
              <td className="py-2 pr-3">
                {QUANTITY_NAME[r.quantity]}
                {r.entry !== 'typed' && (
                  <span className="ml-1 text-xs text-ink-soft">({r.entry === 'lot' ? 'from lot' : 'from file'})</span>
                )}
              </td>
              <td className="num py-2 pr-3 text-right whitespace-nowrap">
                {formatReading(r.quantity, r.value)}
                {r.uncertainty != null && <span className="block text-xs text-ink-soft">±{formatReading(r.quantity, r.uncertainty)}</span>}
              </td>
              <td className="num py-2 pr-3 text-right whitespace-nowrap">
                {r.frequency != null ? formatValue(r.frequency, 'Hz') : <span className="text-ink-faint">—</span>}
              </td>
              <td className="max-w-md py-2 pr-3">
                {r.verdict ? (
                  <>
                    <VerdictBadge verdict={r.verdict} reason={r.verdictReason ?? undefined} />
                    {r.verdictReason && <p className="mt-1 text-xs text-ink-soft">{r.verdictReason}</p>}
                  </>
                ) : (
                  <span className="text-xs text-ink-soft">No limit applies: kept as information</span>
                )}
              </td>
              <td className="py-2 pr-3">
                {r.instrumentName ?? <span className="text-ink-faint">—</span>}
                {r.calibrationOverdue && (
                  <div className="mt-0.5">
                    <OverdueMark className="" />
                  </div>
                )}
              </td>
              <td className="py-2 text-ink-soft">
                {r.takenBy ?? '—'}
                <time className="block text-xs" dateTime={new Date(r.takenAt).toISOString()}>
                  {formatDateTime(r.takenAt)}
                </time>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function PartReadings({ part }: { part: PartDetail }) {
  const canWrite = useCan('write');
  const readings = usePartReadings(part.id);
  const profiles = useProfiles();
  const instruments = useInstruments();
  const profile = profiles.data ? chooseProfile(profiles.data.profiles, part) : null;
  const writable = canWrite && part.status !== 'retired';

  return (
    <div className="space-y-5">
      <p className="text-sm text-ink-soft">
        {profile ? (
          <>
            Judged against the profile <span className="font-medium text-ink">{profile.name}</span>
            {part.tolerancePct != null ? ' (the part’s own tolerance wins for its nominal quantity).' : '.'}
          </>
        ) : part.tolerancePct != null ? (
          'Judged against the part’s own tolerance; no profile matches.'
        ) : (
          'No profile matches this part and it has no tolerance: readings are kept as information.'
        )}
      </p>
      {writable && (
        <div className="rounded-md border border-paper-edge bg-paper p-3 sm:p-4">
          <h3 className="mb-3 text-sm font-semibold">Add a reading</h3>
          {profiles.isPending || instruments.isPending ? (
            <Loading what="Loading profiles and instruments" />
          ) : profiles.isError || instruments.isError ? (
            <Alert>{(profiles.error ?? instruments.error)?.message}</Alert>
          ) : (
            <ReadingForm part={part} profiles={profiles.data.profiles} instruments={instruments.data.instruments} />
          )}
          <BenchSafetyNote compact className="mt-3" />
        </div>
      )}
      {readings.isPending ? (
        <Loading what="Loading readings" />
      ) : readings.isError ? (
        <Alert>{readings.error.message}</Alert>
      ) : readings.data.readings.length === 0 ? (
        <p className="text-sm text-ink-soft">No readings yet.</p>
      ) : (
        <ReadingRows readings={readings.data.readings} />
      )}
    </div>
  );
}
