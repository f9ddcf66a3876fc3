import type { Request } from 'express';
import { confirmPassword } from '../../auth/confirm-password';
import type { Db } from '../../db/client';
import type { SessionUser } from '../../http/route';

/**
 * Every signature needs the signer's password again, not just a live session; tries are limited
 * per person across every app process (server/auth/confirm-password.ts).
 */
export const confirmSignerPassword = (
  db: Db,
  user: SessionUser,
  password: string,
  req: Request,
  subject: string,
) =>
  confirmPassword(db, user, password, req, {
    subject,
    what: 'sign-off',
    failedAction: 'sign-off.failed',
    wrong: 'That password is not right. Your sign-off was not recorded.',
  });
