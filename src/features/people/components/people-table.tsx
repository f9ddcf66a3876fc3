import { useId } from 'react';
import type { PersonView } from '@shared/schemas/people';
import { ROLE_LABELS, ROLES, type Role } from '@shared/schemas/roles';
import { Notice } from '@/components/ui/notice';
import { usePasswordReset, useSecondFactorReset } from '../api/account-admin';
import { useUpdatePerson } from '../api/update-person';

export function PeopleTable({ people, selfId }: { people: PersonView[]; selfId: string }) {
  const update = useUpdatePerson();
  const reset = usePasswordReset();
  const clearCodes = useSecondFactorReset();
  const ownAdminWhy = useId();
  const toggleRole = (p: PersonView, role: Role, on: boolean) => {
    const roles = on ? [...p.roles, role] : p.roles.filter((r) => r !== role);
    update.mutate({ id: p.id, roles });
  };
  return (
    <div className="flex flex-col gap-3">
      {update.error && <Notice tone="error">{update.error.message}</Notice>}
      {reset.error && <Notice tone="error">{reset.error.message}</Notice>}
      {clearCodes.error && <Notice tone="error">{clearCodes.error.message}</Notice>}
      {reset.data && (
        <Notice tone="success">
          A one-time link to choose a new password went to {reset.data.mailedTo} (valid{' '}
          {reset.data.expiresInHours} hours). Their current password works until they use it.
        </Notice>
      )}
      {clearCodes.data && (
        <Notice tone="success">
          {clearCodes.data.person.displayName}’s authenticator is cleared; they are signed out everywhere.
        </Notice>
      )}
      {/* Below 1024 px each person is a card: the table's rows and cells stack. */}
      <div className="rounded-lg border border-rule bg-card">
        <table className="w-full text-left text-sm max-lg:block">
          <thead className="border-b border-rule bg-paper-deep max-lg:sr-only">
            <tr>
              <th className="px-3 py-2">Name</th>
              <th className="px-3 py-2">E-mail</th>
              {ROLES.map((r) => (
                <th key={r} className="px-3 py-2 text-center">
                  {ROLE_LABELS[r]}
                </th>
              ))}
              <th className="px-3 py-2">Status</th>
              <th className="px-3 py-2">Codes</th>
              <th className="px-3 py-2">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody className="max-lg:block">
            {people.map((p) => (
              <tr
                key={p.id}
                className={`border-b border-rule last:border-0 max-lg:flex max-lg:flex-wrap max-lg:gap-x-4 max-lg:py-2 ${p.active ? '' : 'text-graphite-soft'}`}
              >
                <td className="px-3 py-2 font-semibold max-lg:w-full max-lg:pb-0">{p.displayName}</td>
                <td className="px-3 py-2 break-all max-lg:w-full max-lg:pt-0">{p.email}</td>
                {ROLES.map((r) => (
                  <td key={r} className="px-3 py-2 text-center max-lg:flex max-lg:items-center max-lg:gap-2">
                    <input
                      type="checkbox"
                      className="size-5"
                      aria-label={`${p.displayName}: ${ROLE_LABELS[r]}`}
                      checked={p.roles.includes(r)}
                      disabled={update.isPending || (p.id === selfId && r === 'admin')}
                      aria-describedby={p.id === selfId && r === 'admin' ? ownAdminWhy : undefined}
                      onChange={(e) => toggleRole(p, r, e.target.checked)}
                    />
                    <span className="lg:sr-only" aria-hidden="true">
                      {ROLE_LABELS[r]}
                    </span>
                  </td>
                ))}
                <td className="px-3 py-2 max-lg:w-full">
                  {!p.active ? 'Deactivated' : p.hasPassword ? 'Active' : 'Invited'}
                  <span className="lg:hidden">{p.totp ? ' · authenticator on' : ''}</span>
                </td>
                <td className="px-3 py-2 max-lg:hidden">{p.totp ? 'On' : '—'}</td>
                <td className="px-3 py-2 max-lg:w-full">
                  <div className="flex flex-wrap justify-end gap-2 max-lg:justify-start">
                    {p.active && (
                      <button
                        type="button"
                        className="min-h-11 rounded-md border border-rule px-3 hover:bg-paper"
                        aria-label={`Mail ${p.displayName} a password link`}
                        disabled={reset.isPending}
                        onClick={() => reset.mutate(p.id)}
                      >
                        {reset.isPending && reset.variables === p.id
                          ? 'Mailing…'
                          : p.hasPassword
                            ? 'Mail reset link'
                            : 'Mail new invitation link'}
                      </button>
                    )}
                    {p.totp && p.id !== selfId && (
                      <button
                        type="button"
                        className="min-h-11 rounded-md border border-rule px-3 hover:bg-paper"
                        aria-label={`Clear ${p.displayName}’s authenticator`}
                        disabled={clearCodes.isPending}
                        onClick={() => clearCodes.mutate(p.id)}
                      >
                        {clearCodes.isPending && clearCodes.variables === p.id
                          ? 'Clearing…'
                          : 'Clear authenticator'}
                      </button>
                    )}
                    {p.id !== selfId && (
                      <button
                        type="button"
                        className="min-h-11 rounded-md border border-rule px-3 hover:bg-paper"
                        onClick={() => update.mutate({ id: p.id, active: !p.active })}
                      >
                        {p.active ? 'Deactivate' : 'Reactivate'}
                      </button>
                    )}
                  </div>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p id={ownAdminWhy} className="text-xs text-graphite-soft">
        You cannot remove your own admin role; ask another admin.
      </p>
    </div>
  );
}
