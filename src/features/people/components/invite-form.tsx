import { inviteBody } from '@shared/schemas/people';
import { ROLE_LABELS, ROLES } from '@shared/schemas/roles';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { labelOf, showServerError, useZodForm } from '@/lib/form';
import { useInvitePerson } from '../api/invite-person';

export function InviteForm() {
  const invite = useInvitePerson();
  const form = useZodForm(inviteBody, {
    defaultValues: { email: '', displayName: '', roles: ['technician'] },
  });
  const { errors } = form.formState;
  const submit = form.handleSubmit((body) =>
    invite.mutate(body, {
      onSuccess: () => form.reset({ email: '', displayName: '', roles: body.roles }),
      onError: (e) => showServerError(form, e),
    }),
  );

  return (
    <form
      onSubmit={submit}
      className="flex flex-col gap-4 rounded-lg border border-rule bg-card p-5"
      noValidate
    >
      <h2 className="text-lg font-semibold">Invite a person</h2>
      <FormProblem formState={form.formState} />
      {invite.data && (
        <Notice tone="success">
          {invite.data.person.displayName} is invited. An e-mail with a one-time link to choose a password
          went to {invite.data.mailedTo} (valid {invite.data.expiresInDays} days). The link is sent to them
          only.
        </Notice>
      )}
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <Field
          label={labelOf(inviteBody, 'displayName')}
          {...form.register('displayName')}
          error={errors.displayName?.message}
        />
        <Field
          label={labelOf(inviteBody, 'email')}
          type="email"
          {...form.register('email')}
          error={errors.email?.message}
        />
      </div>
      <fieldset aria-describedby={errors.roles ? 'invite-roles-error' : undefined}>
        <legend className="text-sm font-semibold">Roles</legend>
        <div className="mt-2 flex flex-wrap gap-4">
          {ROLES.map((r) => (
            <label key={r} className="flex min-h-11 items-center gap-2">
              <input type="checkbox" className="size-5" value={r} {...form.register('roles')} />
              {ROLE_LABELS[r]}
            </label>
          ))}
        </div>
        {errors.roles && (
          <p id="invite-roles-error" role="alert" className="text-sm text-out">
            {errors.roles.message ?? errors.roles.root?.message}
          </p>
        )}
      </fieldset>
      <Button
        type="submit"
        disabled={invite.isPending}
        whyDisabled="Creating the invitation…"
        className="self-start"
      >
        Create invitation
      </Button>
    </form>
  );
}
