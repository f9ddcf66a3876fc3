import type { Request } from 'express';
import { isCommonPassword } from '../../auth/common-passwords';
import { enrolmentRequired } from '../../auth/second-factor';
import type { AppDeps } from '../../deps';
import { HttpError } from '../../http/errors';
import type { SessionUser } from '../../http/route';

/** Signs the person in on this request; passport gives the session a new id. */
export const logIn = (req: Request, user: SessionUser) =>
  new Promise<void>((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));

export const regenerate = (req: Request) =>
  new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));

export const destroySession = async (req: Request) => {
  await new Promise<void>((resolve, reject) => req.logOut((err) => (err ? reject(err) : resolve())));
  await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
};

/** ASVS 6.2.4: the most common passwords are refused (400 naming the field). */
export function refuseCommonPassword(password: string, field: string) {
  if (isCommonPassword(password)) {
    throw new HttpError(400, 'That password is on the list of most common passwords; choose another.', {
      fields: [{ field, reason: 'is one of the most common passwords' }],
    });
  }
}

/** What the client needs to know about the signed-in person beyond who they are. */
export const sessionFlags = async (deps: AppDeps, user: SessionUser | null) => ({
  enrolmentRequired: user ? await enrolmentRequired(deps.db, user) : false,
});
