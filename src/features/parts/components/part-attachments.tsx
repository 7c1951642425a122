import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Alert, Loading } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { useCan } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { applyServerError } from '@/lib/form';
import { attachmentFileHref, useAttachments, useUploadAttachment } from '../api/attachments';

const ACCEPTED = ['image/jpeg', 'image/png', 'application/pdf'];
const Schema = z.object({
  purpose: z.enum(['photo', 'certificate']),
  file: z
    .custom<FileList>((v) => typeof FileList !== 'undefined' && v instanceof FileList && v.length === 1, 'Choose a photo or a PDF.')
    .refine((l) => ACCEPTED.includes(l[0]!.type), 'Only JPEG, PNG or PDF files.'),
});
type Values = z.input<typeof Schema>;

const size = (bytes: number) =>
  bytes < 1024 * 1024 ? `${Math.max(1, Math.round(bytes / 1024))} kB` : `${(bytes / 1024 / 1024).toFixed(1)} MB`;

export function PartAttachments({ partId }: { partId: number }) {
  const canWrite = useCan('write');
  const list = useAttachments(partId);
  const upload = useUploadAttachment();
  const form = useForm<Values, unknown, z.output<typeof Schema>>({ resolver: zodResolver(Schema), defaultValues: { purpose: 'photo' } });
  const { errors } = form.formState;
  const [fileKey, setFileKey] = useState(0);

  const onSubmit = form.handleSubmit(async (v) => {
    try {
      await upload.mutateAsync({ partId, file: v.file[0]!, purpose: v.purpose });
      form.reset({ purpose: v.purpose });
      setFileKey((k) => k + 1);
    } catch (err) {
      applyServerError(err, form.setError, ['purpose', 'file']);
    }
  });

  const documents = list.data?.attachments.filter((a) => a.purpose === 'photo' || a.purpose === 'certificate') ?? [];

  return (
    <div className="space-y-4">
      {canWrite && (
        <form
          onSubmit={onSubmit}
          noValidate
          aria-label="Upload a photo or certificate"
          className="grid items-start gap-3 sm:grid-cols-[2fr_1fr_auto]"
        >
          {errors.root?.server && (
            <div className="sm:col-span-3">
              <Alert>{errors.root.server.message}</Alert>
            </div>
          )}
          <TextField
            key={fileKey}
            label="File to attach"
            type="file"
            accept="image/jpeg,image/png,application/pdf"
            hint="JPEG, PNG or PDF, up to 10 MB"
            inputClassName="py-1.5"
            error={errors.file?.message}
            {...form.register('file')}
          />
          <SelectField label="What it is" error={errors.purpose?.message} {...form.register('purpose')}>
            <option value="photo">Photo (part or meter display)</option>
            <option value="certificate">Certificate</option>
          </SelectField>
          <Button type="submit" className="sm:mt-6" busy={upload.isPending} busyText="Uploading…">
            Upload
          </Button>
        </form>
      )}
      {list.isPending ? (
        <Loading what="Loading attachments" />
      ) : list.isError ? (
        <Alert>{list.error.message}</Alert>
      ) : documents.length === 0 ? (
        <p className="text-sm text-ink-soft">No photos or certificates.</p>
      ) : (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
          {documents.map((a) => (
            <li key={a.id} className="overflow-hidden rounded-md border border-paper-edge bg-paper">
              <a
                href={attachmentFileHref(a.id)}
                target="_blank"
                rel="noreferrer"
                className="block focus-visible:outline-2 focus-visible:outline-accent"
              >
                {a.mime.startsWith('image/') ? (
                  <img
                    src={attachmentFileHref(a.id)}
                    alt={`${a.purpose === 'photo' ? 'Photo' : 'Certificate'}: ${a.originalName}`}
                    loading="lazy"
                    className="aspect-[4/3] w-full bg-paper-deep object-cover"
                  />
                ) : (
                  <span className="flex aspect-[4/3] w-full items-center justify-center bg-paper-deep text-sm font-semibold text-ink-soft">
                    PDF
                  </span>
                )}
                <span className="block truncate px-2 pt-1.5 text-xs font-medium text-accent">{a.originalName}</span>
              </a>
              <p className="px-2 pb-1.5 text-xs text-ink-soft">
                {a.purpose === 'photo' ? 'Photo' : 'Certificate'} · <span className="num">{size(a.size)}</span> ·{' '}
                {formatDateTime(a.createdAt)}
              </p>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
