import { z } from 'zod';
import { idIn } from '../../http/params';
import { signInSettingsBody } from '../../../shared/schemas/auth';
import { inviteBody, updatePersonBody } from '../../../shared/schemas/people';
import { conflict, badRequest } from '../../http/errors';
import { defineRoute } from '../../http/route';
import {
  INVITE_DAYS,
  invitePerson,
  listPeople,
  RESET_HOURS,
  resetSecondFactor,
  sendPasswordReset,
  setRequireSecondFactor,
  signInSettings,
  updatePerson,
  view,
} from './people.service';

const idParams = z.object({ id: idIn('person') });

export const peopleRoutes = [
  defineRoute({
    method: 'get',
    path: '/people',
    access: ['admin'],
    summary: 'List everyone with their roles',
    handler: async ({ deps }) => ({ people: await listPeople(deps.db) }),
  }),

  defineRoute({
    method: 'post',
    path: '/people/invitations',
    access: ['admin'],
    summary: 'Invite a person: creates them with a one-time set-password link',
    body: inviteBody,
    handler: async ({ req, res, body, user, deps }) => {
      const created = await invitePerson(deps, user!, body, req);
      res.status(201);
      return { person: view(created), mailedTo: created.email, expiresInDays: INVITE_DAYS };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/people/:id/password-reset',
    access: ['admin'],
    summary: 'Mail a person a one-time link to choose a new password (the link is never shown to the admin)',
    params: idParams,
    handler: async ({ req, res, params, user, deps }) => {
      const person = await sendPasswordReset(deps, user!, params.id, req);
      res.status(202);
      return {
        mailedTo: person.email,
        expiresInHours: person.purpose === 'reset' ? RESET_HOURS : INVITE_DAYS * 24,
      };
    },
  }),

  defineRoute({
    method: 'post',
    path: '/people/:id/second-factor-reset',
    access: ['admin'],
    summary: 'Turn off another person’s authenticator and recovery codes (lost phone); they set up a new one',
    params: idParams,
    handler: async ({ req, params, user, deps }) => {
      if (params.id === user!.id) {
        throw badRequest(
          'You cannot clear your own authenticator here; use your account page, or ask another admin.',
          [{ field: 'params.id', label: 'Person', reason: 'That is your own account' }],
        );
      }
      return { person: view(await resetSecondFactor(deps, user!, params.id, req)) };
    },
  }),

  defineRoute({
    method: 'get',
    path: '/settings/sign-in',
    access: ['admin'],
    summary: 'The shop’s sign-in settings',
    handler: async ({ deps }) => {
      const row = await signInSettings(deps.db);
      return {
        requireSecondFactor: row?.requireSecondFactor ?? false,
        updatedAt: row?.updatedAt.toISOString() ?? null,
      };
    },
  }),

  defineRoute({
    method: 'put',
    path: '/settings/sign-in',
    access: ['admin'],
    summary: 'Require authenticator codes for reviewers and admins, or not (audited)',
    body: signInSettingsBody,
    handler: async ({ req, body, user, deps }) => {
      if (body.requireSecondFactor && !user!.totp) {
        throw conflict(
          'Set up your own authenticator on your account page first, so turning this on cannot lock you out.',
        );
      }
      const from = await setRequireSecondFactor(deps.db, user!, body.requireSecondFactor, req);
      return { requireSecondFactor: body.requireSecondFactor, changed: from !== body.requireSecondFactor };
    },
  }),

  defineRoute({
    method: 'patch',
    path: '/people/:id',
    access: ['admin'],
    summary: 'Change a person’s name or roles, or deactivate / reactivate them',
    params: idParams,
    body: updatePersonBody,
    handler: async ({ req, params, body, user, deps }) => {
      if (
        params.id === user!.id &&
        (body.active === false || (body.roles && !body.roles.includes('admin')))
      ) {
        throw badRequest('You cannot remove your own admin role or deactivate yourself; ask another admin.', [
          { field: body.active === false ? 'body.active' : 'body.roles', reason: 'That would lock you out' },
        ]);
      }
      return { person: view(await updatePerson(deps, user!, params.id, body, req)) };
    },
  }),
];
