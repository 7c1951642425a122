// Saved comparisons: open one (anyone), save the current study under a name, save changes to the
// open one or delete it (write roles; the server lets only the owner or qa/admin change it).
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { ComparisonInputSchema, type CompareSelection, type CompareSettings } from '@shared/schemas/compare';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { useCan } from '@/lib/auth';
import { applyServerError } from '@/lib/form';
import { formatDate } from '@/lib/format';
import { useComparisons } from '../api/get-comparisons';
import { useCreateComparison, useDeleteComparison, useUpdateComparison } from '../api/save-comparison';
import type { SavedComparison } from '../api/types';

const NameSchema = ComparisonInputSchema.pick({ name: true, notes: true });

interface Props {
  open: SavedComparison | null;
  selection: CompareSelection;
  settings: CompareSettings;
  onOpen: (id: number | null) => void;
}

export function SavedStudies({ open, selection, settings, onOpen }: Props) {
  const canWrite = useCan('write');
  const list = useComparisons();
  const create = useCreateComparison();
  const update = useUpdateComparison();
  const remove = useDeleteComparison();
  const form = useForm({ resolver: zodResolver(NameSchema), defaultValues: { name: '', notes: '' } });
  const [notes, setNotes] = useState<{ id: number; text: string } | null>(null);
  const notesText = open ? (notes?.id === open.id ? notes.text : (open.notes ?? '')) : '';

  const onSave = form.handleSubmit(async ({ name, notes: newNotes }) => {
    try {
      const saved = await create.mutateAsync({ name, selection, settings, notes: newNotes || null });
      form.reset({ name: '', notes: '' });
      onOpen(saved.id);
    } catch (err) {
      applyServerError(err, form.setError, ['name']);
    }
  });
  const actionError = update.error ?? remove.error;

  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <div>
        <SelectField
          label="Open a saved study"
          value={open?.id ?? ''}
          onChange={(e) => onOpen(e.target.value ? Number(e.target.value) : null)}
          hint={
            open
              ? `${open.name} — saved by ${open.ownerName ?? 'a former member'}, ${formatDate(open.updatedAt ?? open.createdAt)}. Share this page's address to share it.`
              : 'Studies saved by the team, with their selection and settings.'
          }
        >
          <option value="">{list.data?.comparisons.length ? 'Choose a study…' : 'No saved studies yet'}</option>
          {list.data?.comparisons.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
              {c.ownerName ? ` — ${c.ownerName}` : ''}
            </option>
          ))}
        </SelectField>
        {open && !canWrite && open.notes && <p className="mt-2 text-sm whitespace-pre-wrap">Notes: {open.notes}</p>}
        {canWrite && open && (
          <TextAreaField
            label="Notes on this study"
            rows={3}
            className="mt-2"
            value={notesText}
            onChange={(e) => setNotes({ id: open.id, text: e.target.value })}
            hint="Saved with “Save changes”."
          />
        )}
        {canWrite && open && (
          <div className="mt-2 flex flex-wrap gap-2">
            <Button
              size="sm"
              variant="primary"
              busy={update.isPending}
              busyText="Saving…"
              onClick={() => update.mutate({ id: open.id, selection, settings, notes: notesText || null })}
            >
              Save changes to “{open.name}”
            </Button>
            <Button
              size="sm"
              variant="danger"
              busy={remove.isPending}
              busyText="Deleting…"
              onClick={() => {
                if (window.confirm(`Delete the saved study “${open.name}”? The pots and their fits stay.`))
                  remove.mutate(open.id, { onSuccess: () => onOpen(null) });
              }}
            >
              Delete
            </Button>
            {update.isSuccess && !update.isPending && <span className="self-center text-sm text-pass">Saved.</span>}
          </div>
        )}
        {actionError && (
          <div className="mt-2">
            <Alert>{actionError.message}</Alert>
          </div>
        )}
      </div>
      {canWrite ? (
        <form onSubmit={onSave} noValidate className="flex flex-wrap items-start gap-2">
          <TextField
            label="Save this study as"
            placeholder="e.g. Spring lots, both suppliers"
            {...form.register('name')}
            error={form.formState.errors.name?.message ?? form.formState.errors.root?.server?.message}
            className="min-w-0 flex-1"
          />
          <Button type="submit" className="mt-6" busy={create.isPending} busyText="Saving…">
            Save
          </Button>
          <TextAreaField
            label="Notes (optional)"
            rows={2}
            className="w-full"
            {...form.register('notes')}
            error={form.formState.errors.notes?.message}
          />
        </form>
      ) : (
        <p className="self-end text-sm text-ink-soft">Viewers can open and export studies; saving needs a bench, QA or admin account.</p>
      )}
    </div>
  );
}
