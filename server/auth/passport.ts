import { eq } from 'drizzle-orm';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { Db } from '../db/client';
import { people } from '../db/schema';
import type { SessionUser } from '../http/route';
import { burnVerifyTime, hashPassword, passwordNeedsRehash, verifyPassword } from './passwords';

export const toSessionUser = (p: typeof people.$inferSelect): SessionUser => ({
  id: p.id,
  email: p.email,
  displayName: p.displayName,
  roles: p.roles,
});

/**
 * A passport instance per app (not the global singleton), so tests can build several apps.
 * The person is re-read on every request: a deactivated person or a role change takes effect at once.
 */
export function createPassport(db: Db) {
  const instance = new passport.Passport();

  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, async (email, password, done) => {
      try {
        const [person] = await db.select().from(people).where(eq(people.email, email.trim().toLowerCase()));
        if (!person || !person.active || !person.passwordHash) {
          await burnVerifyTime(password);
          return done(null, false);
        }
        if (!(await verifyPassword(person.passwordHash, password))) return done(null, false);
        if (passwordNeedsRehash(person.passwordHash)) {
          await db.update(people).set({ passwordHash: await hashPassword(password) }).where(eq(people.id, person.id));
        }
        return done(null, toSessionUser(person));
      } catch (err) {
        return done(err);
      }
    }),
  );

  instance.serializeUser<string>((user, done) => done(null, (user as SessionUser).id));
  instance.deserializeUser<string>(async (id, done) => {
    try {
      const [person] = await db.select().from(people).where(eq(people.id, id));
      done(null, person && person.active ? toSessionUser(person) : false);
    } catch (err) {
      done(err);
    }
  });

  return instance;
}
