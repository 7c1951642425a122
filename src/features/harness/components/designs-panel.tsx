// Saved designs: open one in the editor, pin one as A, and (writers only) save the editor's design
// as new, save changes to the one it was opened from, or delete. The server checks every write:
// only the owner, or qa/admin, may change or delete a design.
import { zodResolver } from '@hookform/resolvers/zod';
import { memo, useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { roleCan } from '@shared/auth/capabilities';
import type { HarnessPresetId } from '@shared/circuit/presets';
import { HarnessDesignInputSchema, type HarnessDesign } from '@shared/schemas/harness';
import { Alert, Loading } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextAreaField, TextField } from '@/components/ui/field';
import { Panel } from '@/components/ui/page-header';
import { useCan, useUser } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { applyServerError } from '@/lib/form';
import { useHarnesses } from '@/data/harnesses';
import { useCreateHarness, useDeleteHarness, useUpdateHarness } from '../api/save-harness';
import { activeErrors, partRefsOf, presetOf, usedValues, type DesignState } from './design-state';

const SaveFormSchema = HarnessDesignInputSchema.pick({ name: true, notes: true });
type SaveForm = { name: string; notes?: string | null };

/** A design saved from one of the seven presets: the editor above opens these. */
export type PresetDesign = HarnessDesign & { preset: HarnessPresetId };
const isPresetDesign = (d: HarnessDesign): d is PresetDesign => d.preset !== null;

function SaveDesignForm({ state, onSaved }: { state: DesignState; onSaved: (d: HarnessDesign) => void }) {
  const create = useCreateHarness();
  const update = useUpdateHarness();
  const user = useUser();
  const loaded = state.loaded;
  const mayUpdate = !!loaded && !!user && (loaded.ownerId === user.id || roleCan(user.role, 'qa'));
  const form = useForm<SaveForm>({
    resolver: zodResolver(SaveFormSchema),
    defaultValues: { name: loaded?.name ?? '', notes: loaded?.notes ?? '' },
  });
  const { errors, isSubmitting } = form.formState;
  // The message belongs to the saved record; it goes away when the editor leaves that record.
  const [done, setDone] = useState<{ id: number; text: string } | null>(null);

  // Opening another design puts its name and notes in the form.
  useEffect(() => {
    form.reset({ name: loaded?.name ?? '', notes: loaded?.notes ?? '' });
  }, [loaded?.id, loaded?.name, loaded?.notes, form]);

  const bad = activeErrors(state);
  const submit = (mode: 'new' | 'update') =>
    form.handleSubmit(async ({ name, notes }) => {
      setDone(null);
      if (bad.length > 0) {
        form.setError('root.server', { message: 'Some values are not readable (marked in red below); fix them before saving.' });
        return;
      }
      const input = {
        name,
        notes: notes?.trim() ? notes.trim() : null,
        preset: state.preset,
        values: usedValues(state.preset, state.values),
        partRefs: partRefsOf(state),
      };
      try {
        const saved = mode === 'update' && loaded ? await update.mutateAsync({ id: loaded.id, input }) : await create.mutateAsync(input);
        setDone({
          id: saved.id,
          text: mode === 'update' ? `Saved the changes to “${saved.name}”.` : `Saved “${saved.name}” as a new design.`,
        });
        onSaved(saved);
      } catch (err) {
        applyServerError(err, form.setError, ['name', 'notes']);
      }
    });

  return (
    <form onSubmit={submit(mayUpdate ? 'update' : 'new')} noValidate className="space-y-3">
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      {done && done.id === loaded?.id && <Alert tone="success">{done.text}</Alert>}
      <TextField label="Name" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
      <TextAreaField
        label="Notes"
        rows={2}
        hint="What it is for, whose guitar, what the customer asked"
        error={errors.notes?.message}
        {...form.register('notes')}
      />
      <div className="flex flex-wrap gap-2">
        {mayUpdate && (
          <Button type="submit" variant="primary" busy={isSubmitting} busyText="Saving…">
            Save changes
          </Button>
        )}
        <Button
          type={mayUpdate ? 'button' : 'submit'}
          variant={mayUpdate ? 'secondary' : 'primary'}
          busy={!mayUpdate && isSubmitting}
          busyText="Saving…"
          onClick={mayUpdate ? submit('new') : undefined}
        >
          Save as a new design
        </Button>
      </div>
    </form>
  );
}

function DeleteButton({ design, onDeleted }: { design: HarnessDesign; onDeleted: (id: number) => void }) {
  const del = useDeleteHarness();
  const [asking, setAsking] = useState(false);
  if (!asking)
    return (
      <Button size="sm" variant="danger" onClick={() => setAsking(true)} aria-label={`Delete ${design.name}`}>
        Delete
      </Button>
    );
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      <span className="text-sm">Delete “{design.name}”?</span>
      <Button
        size="sm"
        variant="danger"
        busy={del.isPending}
        busyText="Deleting…"
        onClick={() =>
          del.mutate(design.id, {
            onSuccess: () => onDeleted(design.id),
            onSettled: () => setAsking(false),
          })
        }
      >
        Yes, delete
      </Button>
      <Button size="sm" variant="quiet" onClick={() => setAsking(false)}>
        Keep
      </Button>
      {del.isError && <span className="text-sm text-fail">{del.error.message}</span>}
    </span>
  );
}

/** Memoised: a knob change re-renders the screen but not the list of designs. */
export const DesignsPanel = memo(function DesignsPanel({
  state,
  onOpen,
  onPin,
  onSaved,
  onDeleted,
}: {
  state: DesignState;
  onOpen: (d: PresetDesign) => void;
  onPin: (d: PresetDesign) => void;
  onSaved: (d: HarnessDesign) => void;
  onDeleted: (id: number) => void;
}) {
  const list = useHarnesses();
  const canWrite = useCan('write');
  const user = useUser();
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <Panel id="harness-saved" title="Saved designs">
        {list.isPending ? (
          <Loading what="Loading saved designs" />
        ) : list.isError ? (
          <Alert>{list.error.message}</Alert>
        ) : list.data.harnesses.length === 0 ? (
          <p className="text-sm text-ink-soft">
            No saved designs yet.{canWrite ? ' Save the one in the editor with the form beside this list.' : ''}
          </p>
        ) : (
          <ul className="divide-y divide-paper-edge">
            {list.data.harnesses.map((d) => {
              const mayDelete = canWrite && !!user && (d.ownerId === user.id || roleCan(user.role, 'qa'));
              const open = state.loaded?.id === d.id;
              return (
                <li key={d.id} className="flex flex-wrap items-start justify-between gap-2 py-2.5">
                  <div className="min-w-0 flex-1">
                    <p className="font-medium">
                      {d.name}
                      {open && (
                        <span className="ml-2 inline-block whitespace-nowrap rounded bg-accent-tint px-1.5 py-0.5 align-middle text-xs font-normal text-accent-strong">
                          in the editor
                        </span>
                      )}
                    </p>
                    <p className="text-xs text-ink-soft">
                      {d.preset ? (presetOf(d.preset)?.name ?? d.preset) : `Whole instrument (${d.layout}, position ${d.selector})`} ·{' '}
                      {formatDateTime(d.updatedAt ?? d.createdAt)}
                    </p>
                    {d.notes && <p className="mt-0.5 line-clamp-2 text-sm text-ink-soft">{d.notes}</p>}
                  </div>
                  <div className="flex flex-wrap items-center gap-2">
                    {isPresetDesign(d) ? (
                      <>
                        <Button size="sm" onClick={() => onOpen(d)} aria-label={`Open ${d.name} in the editor`}>
                          Open
                        </Button>
                        <Button size="sm" onClick={() => onPin(d)} aria-label={`Pin ${d.name} as A`}>
                          Pin as A
                        </Button>
                      </>
                    ) : (
                      <span className="text-xs text-ink-soft">A whole-instrument design: the preset editor cannot open it</span>
                    )}
                    {mayDelete && <DeleteButton design={d} onDeleted={onDeleted} />}
                  </div>
                </li>
              );
            })}
          </ul>
        )}
      </Panel>
      {canWrite ? (
        <Panel id="harness-save" title={state.loaded ? `Save — opened from “${state.loaded.name}”` : 'Save this design'}>
          <SaveDesignForm state={state} onSaved={onSaved} />
        </Panel>
      ) : (
        <Panel id="harness-save" title="Saving">
          <p className="text-sm text-ink-soft">
            Your role can open, compute and compare designs and download their curves, but not save them. Ask a tech or the shop owner to
            save a design.
          </p>
        </Panel>
      )}
    </div>
  );
});
