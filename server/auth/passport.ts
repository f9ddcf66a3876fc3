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
  totp: p.totpSecret !== null,
});

/**
 * A passport instance per app (not the global singleton), so tests can build several apps.
 * The person behind a session is re-read at most every PERSON_TTL_MS (see deserializeUser).
 */
export function createPassport(db: Db) {
  const instance = new passport.Passport();

  instance.use(
    new LocalStrategy(
      { usernameField: 'email', passwordField: 'password' },
      async (email, password, done) => {
        try {
          const [person] = await db.select().from(people).where(eq(people.email, email.trim().toLowerCase()));
          if (!person || !person.active || !person.passwordHash) {
            await burnVerifyTime(password);
            return done(null, false);
          }
          if (!(await verifyPassword(person.passwordHash, password))) return done(null, false);
          if (passwordNeedsRehash(person.passwordHash)) {
            await db
              .update(people)
              .set({ passwordHash: await hashPassword(password) })
              .where(eq(people.id, person.id));
          }
          return done(null, toSessionUser(person));
        } catch (err) {
          return done(err);
        }
      },
    ),
  );

  // The person behind a session is re-read at most every PERSON_TTL_MS. Deactivation still takes
  // effect at once (it deletes the person's session rows); a role change made here is forgotten at
  // once through forgetPerson, one made by another server process within PERSON_TTL_MS.
  const recent = new Map<string, { user: SessionUser | false; at: number }>();
  instance.serializeUser<string>((user, done) => done(null, (user as SessionUser).id));
  instance.deserializeUser<string>(async (id, done) => {
    const hit = recent.get(id);
    if (hit && Date.now() - hit.at < PERSON_TTL_MS) return done(null, hit.user);
    try {
      const [person] = await db.select().from(people).where(eq(people.id, id));
      const user = person && person.active ? toSessionUser(person) : false;
      if (recent.size > 5_000) recent.clear();
      recent.set(id, { user, at: Date.now() });
      done(null, user);
    } catch (err) {
      done(err);
    }
  });

  return Object.assign(instance, { forgetPerson: (id: string) => recent.delete(id) });
}

const PERSON_TTL_MS = 2_000;
