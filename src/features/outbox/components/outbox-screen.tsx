import { useSearchParams } from 'react-router-dom';
import { Alert, Loading } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { LinkifiedText } from '@/components/ui/linkified-text';
import { PageHeader } from '@/components/ui/page-header';
import { formatDateTime } from '@/lib/format';
import { outboxAttachmentHref, useOutbox, type OutboxMessage } from '../api/get-outbox';

const TOPIC_LABEL: Record<string, string> = {
  invitation: 'Invitation',
  'password-reset': 'Password reset',
  'lot-disposition': 'Lot disposition',
  'customer-report': 'Customer report',
  'lot-reopen': 'Lot reopened',
};

const formatSize = (bytes: number) =>
  bytes < 1024 ? `${bytes} B` : bytes < 1024 * 1024 ? `${(bytes / 1024).toFixed(1)} KiB` : `${(bytes / 1024 / 1024).toFixed(1)} MiB`;

function Attachments({ m }: { m: OutboxMessage }) {
  if (m.attachments.length === 0)
    return (
      <p className="text-sm text-ink-soft">
        {m.attachmentsInSourceOnly
          ? 'Written before attachments were listed here: its attachments are kept only in the stored message source.'
          : 'None.'}
      </p>
    );
  return (
    <ul aria-label="Attachments" className="divide-y divide-paper-edge/70 rounded-md border border-paper-edge">
      {m.attachments.map((a) => (
        <li key={a.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2 text-sm">
          <span className="min-w-0">
            <span className="num block break-all font-medium">{a.filename}</span>
            <span className="text-xs text-ink-soft">
              {a.contentType} · {formatSize(a.size)}
            </span>
          </span>
          <a
            href={outboxAttachmentHref(m.id, a.id)}
            download={a.filename}
            className="shrink-0 rounded-md border border-paper-edge px-2 py-1 text-accent underline-offset-2 hover:underline"
          >
            Download<span className="sr-only"> {a.filename}</span>
          </a>
        </li>
      ))}
    </ul>
  );
}

function Delivery({ m }: { m: OutboxMessage }) {
  if (m.error) return <Badge tone="fail" icon="cross" label="Not sent" title={m.error} />;
  if (m.transport === 'smtp')
    return m.sentAt ? <Badge tone="pass" icon="check" label="Mailed" /> : <Badge tone="marginal" icon="edge" label="Queued" />;
  return <Badge tone="neutral" icon="shelf" label="Kept here" />;
}

function MessageView({ m, onClose }: { m: OutboxMessage; onClose: () => void }) {
  return (
    <article aria-labelledby="message-subject" className="rounded-lg border border-paper-edge bg-paper-bright p-4 sm:p-5">
      <div className="mb-3 flex items-start justify-between gap-3">
        <h2 id="message-subject" className="text-lg font-semibold">
          {m.subject}
        </h2>
        <Button size="sm" onClick={onClose}>
          Close
        </Button>
      </div>
      <dl className="mb-4 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-ink-soft">To</dt>
        <dd className="break-all">{m.to}</dd>
        <dt className="text-ink-soft">Topic</dt>
        <dd>{TOPIC_LABEL[m.topic] ?? m.topic}</dd>
        <dt className="text-ink-soft">Written</dt>
        <dd>{formatDateTime(m.createdAt)}</dd>
        <dt className="text-ink-soft">Delivery</dt>
        <dd>
          <Delivery m={m} />
        </dd>
      </dl>
      {m.error && <Alert title="Sending failed">{m.error}</Alert>}
      <LinkifiedText text={m.text} className="mt-3 rounded-md bg-paper p-3 text-sm leading-relaxed" />
      <h3 className="mt-4 mb-2 text-sm font-semibold">Attachments ({m.attachments.length})</h3>
      <Attachments m={m} />
    </article>
  );
}

export function OutboxScreen() {
  const outbox = useOutbox();
  const [search, setSearch] = useSearchParams();
  const openId = Number(search.get('message'));

  const open = (id: number | null) =>
    setSearch(
      (prev) => {
        const next = new URLSearchParams(prev);
        if (id) next.set('message', String(id));
        else next.delete('message');
        return next;
      },
      { replace: true },
    );

  const messages = outbox.data?.messages ?? [];
  const current = messages.find((m) => m.id === openId) ?? null;

  return (
    <div>
      <PageHeader
        title="Outbox"
        description="Every message Lugbook writes: invitations, password resets, lot notices and customer reports. With no mail server set up, they stay here."
        actions={
          <Button size="sm" onClick={() => void outbox.refetch()} busy={outbox.isFetching} busyText="Refreshing…">
            Refresh
          </Button>
        }
      />
      {outbox.isPending ? (
        <Loading what="Loading messages" />
      ) : outbox.isError ? (
        <Alert>{outbox.error.message}</Alert>
      ) : messages.length === 0 ? (
        <p className="rounded-lg border border-dashed border-paper-edge bg-paper-bright p-6 text-sm text-ink-soft">No messages yet.</p>
      ) : (
        <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
          <ul
            aria-label="Messages, newest first"
            className="divide-y divide-paper-edge/70 self-start rounded-lg border border-paper-edge bg-paper-bright"
          >
            {messages.map((m) => (
              <li key={m.id}>
                <button
                  type="button"
                  onClick={() => open(m.id)}
                  aria-current={m.id === current?.id ? 'true' : undefined}
                  className={`block w-full border-l-4 px-4 py-3 text-left ${m.id === current?.id ? 'border-accent bg-accent-tint' : 'border-transparent hover:bg-paper'}`}
                >
                  <span className="flex items-center justify-between gap-2">
                    <span className="truncate font-medium">{m.subject}</span>
                    <Delivery m={m} />
                  </span>
                  <span className="mt-0.5 flex justify-between gap-2 text-xs text-ink-soft">
                    <span className="truncate">
                      {m.to}
                      {m.attachments.length > 0 && ` · ${m.attachments.length} attachment${m.attachments.length === 1 ? '' : 's'}`}
                    </span>
                    <span className="shrink-0">{formatDateTime(m.createdAt)}</span>
                  </span>
                </button>
              </li>
            ))}
          </ul>
          <div className="order-first lg:order-none lg:sticky lg:top-4 lg:self-start">
            {current ? (
              <MessageView m={current} onClose={() => open(null)} />
            ) : (
              <p className="hidden rounded-lg border border-dashed border-paper-edge p-6 text-sm text-ink-soft lg:block">
                Choose a message to read it.
              </p>
            )}
          </div>
        </div>
      )}
    </div>
  );
}
