import type { Member } from '@shared/schemas/auth';
import { ROLES, type Role } from '@shared/schemas/common';
import { Alert, Loading } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { useUser } from '@/lib/auth';
import { ROLE_LABEL, formatDate } from '@/lib/format';
import { useMembers } from '../api/get-members';
import { useUpdateMember } from '../api/update-member';

export function MembersTable() {
  const members = useMembers();
  const update = useUpdateMember();
  const me = useUser();

  if (members.isPending) return <Loading what="Loading members" />;
  if (members.isError) return <Alert>{members.error.message}</Alert>;

  const change = (m: Member, role?: Role, disabled?: boolean) =>
    update.mutate({ id: m.id, change: { ...(role ? { role } : {}), ...(disabled !== undefined ? { disabled } : {}) } });

  return (
    <div className="space-y-3">
      {update.isError && <Alert>{update.error.message}</Alert>}
      <div className="overflow-x-auto">
        <table className="w-full min-w-[640px] border-collapse text-sm">
          <caption className="sr-only">Members of the workshop</caption>
          <thead className="text-left text-ink-soft">
            <tr className="border-b border-paper-edge">
              <th scope="col" className="px-2 py-2 font-medium">
                Name
              </th>
              <th scope="col" className="px-2 py-2 font-medium">
                E-mail
              </th>
              <th scope="col" className="px-2 py-2 font-medium">
                Role
              </th>
              <th scope="col" className="px-2 py-2 font-medium">
                Account
              </th>
              <th scope="col" className="px-2 py-2 font-medium">
                Since
              </th>
            </tr>
          </thead>
          <tbody>
            {members.data.members.map((m) => {
              const self = m.id === me?.id;
              const busy = update.isPending && update.variables.id === m.id;
              return (
                <tr key={m.id} className="border-b border-paper-edge/70 last:border-b-0">
                  <td className="px-2 py-2 font-medium">
                    {m.name}
                    {self && <span className="ml-1.5 text-xs font-normal text-ink-soft">(you)</span>}
                  </td>
                  <td className="px-2 py-2 break-all">{m.email}</td>
                  <td className="px-2 py-2">
                    <label className="sr-only" htmlFor={`role-${m.id}`}>
                      Role of {m.name}
                    </label>
                    <select
                      id={`role-${m.id}`}
                      value={m.role}
                      disabled={self || busy}
                      title={self ? 'You cannot change your own role; ask another admin.' : undefined}
                      onChange={(e) => change(m, e.target.value as Role)}
                      className="rounded-md border border-paper-edge bg-paper-bright px-2 py-1.5 disabled:bg-paper-deep disabled:text-ink-soft"
                    >
                      {ROLES.map((r) => (
                        <option key={r} value={r}>
                          {ROLE_LABEL[r]}
                        </option>
                      ))}
                    </select>
                  </td>
                  <td className="px-2 py-2">
                    <div className="flex flex-wrap items-center gap-2">
                      {m.disabledAt ? (
                        <Badge tone="fail" icon="cross" label="Disabled" />
                      ) : (
                        <Badge tone="pass" icon="check" label="Active" />
                      )}
                      {!self && (
                        <Button
                          size="sm"
                          variant={m.disabledAt ? 'secondary' : 'danger'}
                          disabled={busy}
                          onClick={() => change(m, undefined, !m.disabledAt)}
                          aria-label={`${m.disabledAt ? 'Enable' : 'Disable'} ${m.name}`}
                        >
                          {m.disabledAt ? 'Enable' : 'Disable'}
                        </Button>
                      )}
                    </div>
                  </td>
                  <td className="px-2 py-2 text-ink-soft">{formatDate(m.createdAt)}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-soft">Changing a role or disabling an account signs that member out everywhere.</p>
    </div>
  );
}
