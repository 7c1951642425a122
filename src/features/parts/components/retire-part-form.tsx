import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { Part } from '@shared/schemas/parts';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextAreaField } from '@/components/ui/field';
import { applyServerError } from '@/lib/form';
import { useUpdatePart } from '../api/update-part';

// The API accepts a retirement without a reason; the screen asks for one so the history explains it.
const RetireSchema = z.object({
  statusReason: z.string().trim().min(1, 'Say why the part is retired.').max(300, 'Keep the reason to 300 characters.'),
});

export function RetirePartForm({ part, onDone }: { part: Part; onDone: () => void }) {
  const update = useUpdatePart();
  const form = useForm({ resolver: zodResolver(RetireSchema), defaultValues: { statusReason: '' } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async ({ statusReason }) => {
    try {
      await update.mutateAsync({ id: part.id, input: { status: 'retired', statusReason } });
      onDone();
    } catch (err) {
      applyServerError(err, form.setError, ['statusReason']);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label={`Retire ${part.label}`} className="space-y-3">
      <p className="text-sm text-ink-soft">A retired part stays in the notebook with its history; it just leaves the working stock.</p>
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <TextAreaField
        label="Reason"
        rows={2}
        autoFocus
        placeholder="e.g. wiper worn, scratchy at mid-rotation"
        error={errors.statusReason?.message}
        {...form.register('statusReason')}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="danger" busy={update.isPending} busyText="Retiring…">
          Retire part
        </Button>
        <Button onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}
