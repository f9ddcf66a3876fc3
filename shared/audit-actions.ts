/**
 * Every action the audit log records, with the words a person reads: a label for the filter and
 * the sentence an entry makes ("Marek Vos approved revision 3 of TC-18 mains fuse"). The server
 * records only these actions; the admin page shows the raw record one click away.
 */
export interface AuditEntryWords {
  actor: string | null;
  subject: string | null;
  details: Record<string, unknown>;
}

type Phrase = (e: AuditEntryWords) => string;

/** "TC-18 mains fuse r3" (how revision subjects are recorded) read as "revision 3 of TC-18 mains fuse". */
export function revisionWords(subject: string | null): string {
  const m = subject?.match(/^(.*) r(\d+)$/);
  return m ? `revision ${m[2]} of ${m[1]}` : (subject ?? 'a revision');
}

const who = (e: AuditEntryWords) => e.subject ?? 'an account';
const count = (n: unknown, one: string) => (typeof n === 'number' ? `${n} ${one}${n === 1 ? '' : 's'}` : '');

const qualificationWords = (d: Record<string, unknown>) =>
  d.scope === 'live' ? 'live work' : `${typeof d.family === 'string' ? d.family : 'a family of'} procedures`;

const ACTIONS = {
  'sign-in': { label: 'Signed in', phrase: () => 'signed in' },
  'sign-in.failed': { label: 'Sign-in refused', phrase: (e) => `a sign-in as ${who(e)} was refused` },
  'sign-in.code-failed': {
    label: 'Authenticator code refused',
    phrase: (e) => `an authenticator code for ${who(e)} was refused`,
  },
  'sign-out': { label: 'Signed out', phrase: () => 'signed out' },
  'sign-out.everywhere': {
    label: 'Signed out everywhere',
    phrase: (e) =>
      `signed out on every device (${count(e.details.sessionsEnded, 'session') || 'all sessions'})`,
  },
  'reauth.failed': {
    label: 'Password check refused',
    phrase: () => 'gave a wrong password to confirm an action',
  },
  'person.invited': { label: 'Person invited', phrase: (e) => `invited ${who(e)}` },
  'person.password-set': { label: 'Password chosen', phrase: () => 'chose a password from a one-time link' },
  'person.password-changed': { label: 'Password changed', phrase: () => 'changed their password' },
  'person.password-reset-sent': {
    label: 'Password link sent',
    phrase: (e) => `sent ${who(e)} a link to choose a password`,
  },
  'person.second-factor-enabled': { label: 'Authenticator set up', phrase: () => 'set up an authenticator' },
  'person.second-factor-disabled': {
    label: 'Authenticator removed',
    phrase: () => 'removed their authenticator',
  },
  'person.second-factor-reset': {
    label: 'Authenticator cleared',
    phrase: (e) => `cleared the authenticator of ${who(e)}`,
  },
  'person.recovery-codes-renewed': {
    label: 'Recovery codes renewed',
    phrase: () => 'renewed their recovery codes',
  },
  'settings.changed': { label: 'Shop setting changed', phrase: () => 'changed the sign-in rules' },
  'person.roles-changed': { label: 'Roles changed', phrase: (e) => `changed the roles of ${who(e)}` },
  'person.deactivated': { label: 'Person deactivated', phrase: (e) => `deactivated ${who(e)}` },
  'person.reactivated': { label: 'Person reactivated', phrase: (e) => `reactivated ${who(e)}` },
  'revision.submitted': {
    label: 'Revision submitted',
    phrase: (e) => `submitted ${revisionWords(e.subject)} for review`,
  },
  'revision.approved': { label: 'Revision approved', phrase: (e) => `approved ${revisionWords(e.subject)}` },
  'revision.returned': { label: 'Revision returned', phrase: (e) => `returned ${revisionWords(e.subject)}` },
  'revision.superseded': {
    label: 'Revision superseded',
    phrase: (e) => `replaced ${revisionWords(e.subject)} with a newer approval`,
  },
  'revision.withdrawn': {
    label: 'Revision withdrawn',
    phrase: (e) => `withdrew ${revisionWords(e.subject)}`,
  },
  'revision.acknowledged': {
    label: 'Revision acknowledged',
    phrase: (e) => `read and acknowledged what changed in ${revisionWords(e.subject)}`,
  },
  'sign-off.reauthenticated': {
    label: 'Password confirmed for a sign-off',
    phrase: () => 'confirmed their password to sign',
  },
  'sign-off.failed': { label: 'Sign-off refused', phrase: () => 'gave a wrong password to sign' },
  'review.commented': { label: 'Review comment', phrase: (e) => `commented on ${revisionWords(e.subject)}` },
  'run.signed': {
    label: 'Run sheet signed',
    phrase: (e) =>
      `signed a bench run${e.details.outOfTolerance ? ` with ${count(e.details.outOfTolerance, 'reading')} out of band` : ''}`,
  },
  'run.handed-over': {
    label: 'Bench run handed over',
    phrase: () => 'handed a bench run over to another technician',
  },
  'run.abandoned': { label: 'Bench run closed unfinished', phrase: () => 'closed a bench run unfinished' },
  'run.witnessed': {
    label: 'Bench run witnessed',
    phrase: () => 'co-signed a trainee’s bench run as its witness',
  },
  'run.hold-decided': {
    label: 'Hold point decided',
    phrase: (e) =>
      e.details.decision === 'abandon'
        ? 'abandoned a bench run stopped at a hold point'
        : 'let a bench run stopped at a hold point continue',
  },
  'run.step-excepted': {
    label: 'Step recorded as not applicable or a deviation',
    phrase: (e) =>
      e.details.kind === 'deviation'
        ? 'recorded a deviation on a bench-run step'
        : 'recorded a bench-run step as not applicable',
  },
  'run.deviation-decided': {
    label: 'Deviation decided',
    phrase: (e) => `${e.details.decision === 'approved' ? 'approved' : 'refused'} a deviation on a bench run`,
  },
  'instrument.added': {
    label: 'Instrument added',
    phrase: (e) => `added ${e.subject ?? 'an instrument'} to the instrument register`,
  },
  'instrument.changed': {
    label: 'Instrument changed',
    phrase: (e) => `changed instrument ${e.subject ?? ''}`,
  },
  'instrument.certificate-added': {
    label: 'Calibration certificate added',
    phrase: (e) => `added a calibration certificate for ${e.subject ?? 'an instrument'}`,
  },
  'qualification.granted': {
    label: 'Qualification granted',
    phrase: (e) => `qualified ${who(e)} for ${qualificationWords(e.details)}`,
  },
  'qualification.withdrawn': {
    label: 'Qualification withdrawn',
    phrase: (e) => `withdrew ${qualificationWords(e.details)} from ${who(e)}`,
  },
  'run.released': {
    label: 'Bench run released',
    phrase: () => 'signed a bench run as checked and released',
  },
  'unit.state-changed': {
    label: 'Unit state changed',
    phrase: (e) => `set unit ${e.subject ?? ''} to ${String(e.details.stateWords ?? e.details.state ?? '')}`,
  },
  'follow-up.opened': {
    label: 'Follow-up opened',
    phrase: (e) => `opened a follow-up on ${e.subject ?? 'a unit'} for out-of-band readings`,
  },
  'follow-up.decided': {
    label: 'Follow-up disposition',
    phrase: (e) => `recorded a disposition on the follow-up of ${e.subject ?? 'a unit'}`,
  },
  'follow-up.reassigned': {
    label: 'Follow-up reassigned',
    phrase: (e) => `gave the follow-up of ${e.subject ?? 'a unit'} to another owner`,
  },
  'follow-up.closed': {
    label: 'Follow-up closed',
    phrase: (e) => `closed the follow-up of ${e.subject ?? 'a unit'}`,
  },
} as const satisfies Record<string, { label: string; phrase: Phrase }>;

export type AuditAction = keyof typeof ACTIONS;
export const AUDIT_ACTIONS = Object.keys(ACTIONS) as [AuditAction, ...AuditAction[]];

export const auditActionLabel = (action: string): string =>
  (ACTIONS as Record<string, { label: string }>)[action]?.label ?? action;

/** The entry as one sentence. An entry with no person (a refused sign-in) starts with what happened. */
export function auditSentence(action: string, e: AuditEntryWords): string {
  const def = (ACTIONS as Record<string, { phrase: Phrase }>)[action];
  const phrase = def ? def.phrase(e) : action;
  const text = e.actor ? `${e.actor} ${phrase}` : phrase.charAt(0).toUpperCase() + phrase.slice(1);
  return `${text}.`;
}
