// Watchers of a lot: qa leads and admins add and remove any member; a tech watches or stops
// watching the lot themself. Watchers get an e-mail on a disposition and on a reopen.
import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { useCan, useUser } from '@/lib/auth';
import { useMembers, useSetWatchers } from '../api/get-members';
import type { LotDetail } from '../api/types';

export function LotWatchers({ lot }: { lot: LotDetail }) {
  const user = useUser();
  const canChoose = useCan('qa');
  const canWrite = useCan('write');
  const members = useMembers(canChoose);
  const save = useSetWatchers();
  const [adding, setAdding] = useState('');
  const ids = lot.watchers.map((w) => w.id);
  const set = (next: string[]) => save.mutate({ id: lot.id, userIds: next });
  const others = (members.data?.members ?? []).filter((m) => !ids.includes(m.id));
  return (
    <div className="space-y-3">
      {save.isError && <Alert>{save.error.message}</Alert>}
      {lot.watchers.length === 0 ? (
        <p className="text-sm text-ink-soft">Nobody watches this lot.</p>
      ) : (
        <ul className="space-y-1">
          {lot.watchers.map((w) => (
            <li key={w.id} className="flex flex-wrap items-center gap-2 text-sm">
              <span>{w.name}</span>
              <span className="text-xs break-all text-ink-soft">{w.email}</span>
              {(canChoose || w.id === user?.id) && (
                <Button
                  size="sm"
                  variant="secondary"
                  disabled={save.isPending}
                  aria-label={`Remove ${w.name} as a watcher`}
                  onClick={() => set(ids.filter((id) => id !== w.id))}
                >
                  Remove
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {canChoose ? (
        <form
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (adding) set([...ids, adding]);
            setAdding('');
          }}
        >
          <label className="text-sm">
            <span className="mb-1 block font-medium">Add a watcher</span>
            <select
              className="rounded-md border border-paper-edge bg-paper-bright px-2 py-1.5 text-sm"
              value={adding}
              onChange={(e) => setAdding(e.target.value)}
              disabled={members.isPending}
            >
              <option value="">Choose a member…</option>
              {others.map((m) => (
                <option key={m.id} value={m.id}>
                  {m.name} ({m.email})
                </option>
              ))}
            </select>
          </label>
          <Button type="submit" size="sm" variant="primary" disabled={!adding || save.isPending}>
            Add
          </Button>
        </form>
      ) : canWrite && user && !ids.includes(user.id) ? (
        <Button size="sm" variant="secondary" disabled={save.isPending} onClick={() => set([...ids, user.id])}>
          Watch this lot
        </Button>
      ) : null}
    </div>
  );
}
