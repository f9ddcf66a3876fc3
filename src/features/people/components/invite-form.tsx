import { useState, type FormEvent } from 'react';
import { ROLE_LABELS, ROLES, type Role } from '@shared/schemas/roles';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useInvitePerson } from '../api/invite-person';

export function InviteForm() {
  const invite = useInvitePerson();
  const [email, setEmail] = useState('');
  const [displayName, setDisplayName] = useState('');
  const [roles, setRoles] = useState<Role[]>(['technician']);
  const fieldError = (name: string) => invite.error?.fields.find((f) => f.field === `body.${name}`)?.reason;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    invite.mutate(
      { email, displayName, roles },
      {
        onSuccess: () => {
          setEmail('');
          setDisplayName('');
        },
      },
    );
  };

  return (
    <form
      onSubmit={submit}
      className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-5"
      noValidate
    >
      <h2 className="text-lg font-semibold">Invite a person</h2>
      {invite.error && <Notice tone="error">{invite.error.message}</Notice>}
      {invite.data && (
        <Notice tone="success">
          {invite.data.person.displayName} is invited. An e-mail with a one-time link to choose a password
          went to {invite.data.mailedTo} (valid {invite.data.expiresInDays} days). The link is sent to them
          only.
        </Notice>
      )}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          label="Name"
          value={displayName}
          onChange={(e) => setDisplayName(e.target.value)}
          error={fieldError('displayName')}
        />
        <Field
          label="E-mail"
          type="email"
          value={email}
          onChange={(e) => setEmail(e.target.value)}
          error={fieldError('email')}
        />
      </div>
      <fieldset>
        <legend className="text-sm font-semibold">Roles</legend>
        <div className="mt-2 flex flex-wrap gap-4">
          {ROLES.map((r) => (
            <label key={r} className="flex min-h-11 items-center gap-2">
              <input
                type="checkbox"
                className="size-5"
                checked={roles.includes(r)}
                onChange={(e) => setRoles(e.target.checked ? [...roles, r] : roles.filter((x) => x !== r))}
              />
              {ROLE_LABELS[r]}
            </label>
          ))}
        </div>
        {fieldError('roles') && <p className="text-sm text-out">{fieldError('roles')}</p>}
      </fieldset>
      <Button type="submit" disabled={invite.isPending} className="self-start">
        Create invitation
      </Button>
    </form>
  );
}
