// The job's before and after: the wiring the instrument had before the work (a saved design, or a
// copy of one kept with the job), the customer's own direct-input recording, and the Listen panel
// with the before wiring as A and the job's design as B at the same knobs. The customer report
// attaches the same pair as clips (server/features/jobs/clips.ts).
import { useId, useState } from 'react';
import { DesignListen, type ListenableDesign } from '@/components/listen/design-listen';
import { RecordingChainFields } from '@/components/listen/recording-chain-fields';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { formatDateTime } from '@/lib/format';
import { useHarnesses } from '@/data/harnesses';
import { useJobAttachments, useSetJobBefore, useUploadJobRecording } from '../api/job-before';
import type { JobDetail } from '../api/types';

const sel = 'max-w-full rounded-md border border-paper-edge bg-paper-bright px-2 py-1.5 text-sm';

function BeforeControls({ job }: { job: JobDetail }) {
  const harnesses = useHarnesses();
  const set = useSetJobBefore();
  const upload = useUploadJobRecording();
  const ids = { before: useId(), copy: useId(), file: useId() };
  const [copy, setCopy] = useState(false);
  const [inputKOhm, setInputKOhm] = useState(String((job.recordingChain?.inputR ?? 1e6) / 1e3));
  const [cableM, setCableM] = useState(String(job.recordingChain?.cableLength ?? 3));
  const choose = (value: string) => {
    if (value === '') return set.mutate({ id: job.id, input: { harnessId: null, design: null } });
    const h = harnesses.data?.harnesses.find((x) => x.id === Number(value));
    if (!h) return;
    set.mutate({
      id: job.id,
      input: copy
        ? {
            harnessId: null,
            design: { name: h.name, layout: h.layout, selector: h.selector, options: h.options, knobs: h.knobs, values: h.values as never },
          }
        : { harnessId: h.id, design: null },
    });
  };
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-4">
        <label htmlFor={ids.before} className="min-w-0 max-w-full text-sm">
          <span className="mb-1 block font-medium">Wiring before the work</span>
          <select
            id={ids.before}
            className={sel}
            value={job.beforeHarnessId ?? ''}
            disabled={set.isPending || harnesses.isPending}
            onChange={(e) => choose(e.target.value)}
          >
            <option value="">{job.beforeDesign ? `Kept with the job: ${job.beforeDesign.name ?? 'a design'}` : 'Not recorded'}</option>
            {harnesses.data?.harnesses.map((h) => (
              <option key={h.id} value={h.id}>
                {h.name}
              </option>
            ))}
          </select>
        </label>
        <label htmlFor={ids.copy} className="flex items-center gap-2 pb-2 text-sm">
          <input id={ids.copy} type="checkbox" checked={copy} onChange={(e) => setCopy(e.currentTarget.checked)} />
          Keep a copy with the job (later edits to the saved design do not change it)
        </label>
        {job.beforeDesign && (
          <Button size="sm" disabled={set.isPending} onClick={() => set.mutate({ id: job.id, input: { harnessId: null, design: null } })}>
            Forget the kept copy
          </Button>
        )}
      </div>
      <div className="flex flex-wrap items-end gap-4">
        <div className="text-sm">
          <label htmlFor={ids.file} className="mb-1 block font-medium">
            Customer&apos;s recording (WAV, direct input, before the work)
          </label>
          <input
            id={ids.file}
            type="file"
            accept=".wav,audio/wav"
            disabled={upload.isPending}
            onChange={(e) => {
              const file = e.currentTarget.files?.[0];
              if (file) upload.mutate({ id: job.id, file });
              e.currentTarget.value = '';
            }}
          />
        </div>
        <RecordingChainFields inputKOhm={inputKOhm} cableM={cableM} onInputKOhm={setInputKOhm} onCableM={setCableM} className="contents" />
        <Button
          size="sm"
          disabled={set.isPending}
          onClick={() =>
            set.mutate({ id: job.id, input: { recordingChain: { inputR: Number(inputKOhm) * 1e3, cableLength: Number(cableM) } } })
          }
        >
          Save how it was recorded
        </Button>
      </div>
      {set.isError && <Alert>{set.error.message}</Alert>}
      {upload.isError && <Alert>{upload.error.message}</Alert>}
    </div>
  );
}

function Recordings({ job }: { job: JobDetail }) {
  const list = useJobAttachments(job.id);
  const recordings = list.data?.attachments.filter((a) => a.purpose === 'recording') ?? [];
  if (recordings.length === 0)
    return <p className="text-sm text-ink-soft">No recording attached: the report&apos;s clips use the built-in phrase.</p>;
  return (
    <p className="text-sm">
      The report&apos;s clips use the latest recording, <strong>{recordings[0]!.originalName}</strong> (
      {(recordings[0]!.size / 1e6).toFixed(1)} MB, {formatDateTime(recordings[0]!.createdAt)}), through its first 10 s.
      {recordings.length > 1 && ` ${recordings.length - 1} older recording(s) are kept.`}
    </p>
  );
}

export function JobListen({ job, canWrite }: { job: JobDetail; canWrite: boolean }) {
  const harnesses = useHarnesses();
  const after = harnesses.data?.harnesses.find((h) => h.id === job.harnessId);
  const beforeRow = job.beforeHarnessId != null ? harnesses.data?.harnesses.find((h) => h.id === job.beforeHarnessId) : undefined;
  const before: ListenableDesign | null = beforeRow
    ? { ...beforeRow, label: `Before: ${beforeRow.name}` }
    : job.beforeDesign
      ? { ...job.beforeDesign, label: `Before: ${job.beforeDesign.name ?? 'kept with the job'}` }
      : null;
  return (
    <div className="space-y-4">
      {canWrite && <BeforeControls job={job} />}
      {!canWrite && (
        <p className="text-sm">
          Wiring before the work:{' '}
          {job.beforeHarnessName ?? job.beforeDesign?.name ?? (job.beforeDesign ? 'kept with the job' : 'not recorded')}
        </p>
      )}
      {job.beforeHarnessId != null && !job.beforeHarnessName && (
        <Alert>The saved design of the wiring before the work has been deleted; choose another.</Alert>
      )}
      <Recordings job={job} />
      {after && (
        <p className="text-sm text-ink-soft">
          The report&apos;s clips use the design&apos;s saved knobs
          {after.knobs && Object.keys(after.knobs).length > 0
            ? ` (${Object.entries(after.knobs)
                .map(([k, v]) => `${k} ${v}`)
                .join(', ')})`
            : ' (all at 10)'}
          ; the sliders below are for listening here only.
        </p>
      )}
      {after ? (
        <DesignListen
          key={`${after.id}|${before?.label ?? ''}`}
          panelId="job-listen"
          design={{ ...after, label: `After: ${after.name}` }}
          before={before}
        />
      ) : (
        <p className="text-sm text-ink-soft">Choose the job&apos;s harness design above to listen to it.</p>
      )}
    </div>
  );
}
