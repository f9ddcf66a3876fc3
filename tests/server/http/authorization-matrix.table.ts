// Who may call what: every API route × (anonymous, technician, author, reviewer, admin), written by hand
// from the product's roles, not read off the code:
//   technician — reads approved procedures, runs them on units, records readings and photos, signs run sheets;
//   author     — writes and edits drafts, submits them, sees and writes review comments;
//   reviewer   — reviews submitted revisions, approves or returns them (signed), withdraws from use;
//   admin      — invites and deactivates people, assigns roles, mails password resets, sets the shop's sign-in
//                rules, reads the audit log, the mail outbox and the API description.
// Reviewers and admins keep the instrument register and grant or withdraw qualifications.
// A signed run is released by a second qualified person: a reviewer or a technician (qualification checked
// by the service). Follow-ups: their owner (a technician), reviewers and admins record dispositions; only
// reviewers and admins reassign them. Technicians, reviewers and admins set a unit's state with a reason.
// Everyone manages their own password, sessions and authenticator.
// Everyone signed in reads what has been approved, the unit register and bench runs.
//
// Each probe aims at a real target, so an allowed caller gets a 2xx or a well-defined 4xx (404 for a
// random id, 400 for an empty body) and a refused one gets 401 (anonymous) or 403 (wrong role).

export const ACTORS = ['anonymous', 'technician', 'author', 'reviewer', 'admin'] as const;
export type Actor = (typeof ACTORS)[number];

/** What probes point at; the test creates these before the walk. */
export type Target =
  | 'approvedProcedure' // an approved procedure (revision 1 approved)
  | 'approvedRevision' // that procedure's approved revision
  | 'inReviewRevision' // another procedure's revision 1, in review
  | 'approvalSignature' // a reviewer's approval signature on a seeded procedure
  | 'unit' // a unit in the register
  | 'run' // a bench run in progress on the approved revision
  | 'runStep' // one of that run's steps
  | 'randomId' // a UUID that names nothing
  | 'randomToken'; // a set-password token that was never issued

export interface Probe {
  params?: Record<string, Target>;
  query?: Record<string, string>;
  /** Sent as JSON on writes (an empty object when omitted). */
  body?: Record<string, unknown>;
  /** The probe ends the session it runs in, so it gets a session of its own. */
  freshSession?: true;
  /** The probe ends every session of its person: the shared sessions are signed in again after it. */
  endsEverySession?: true;
}

export interface MatrixRow {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  /** Exactly as in server/routes.ts (below /api). */
  path: string;
  probe: Probe;
  expect: Record<Actor, number>;
}

const NEVER_ISSUED = 'never-issued-token-0123456789abcdefghijklmnopq';

export const MATRIX: readonly MatrixRow[] = [
  // Health and session: public.
  {
    method: 'get',
    path: '/health',
    probe: {},
    expect: { anonymous: 200, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'get',
    path: '/auth/session',
    probe: {},
    expect: { anonymous: 200, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'get',
    path: '/auth/me',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/auth/sign-in',
    probe: { body: {} },
    expect: { anonymous: 400, technician: 400, author: 400, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/auth/sign-out',
    probe: { freshSession: true },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'get',
    path: '/auth/invitations/:token',
    probe: { params: { token: 'randomToken' } },
    expect: { anonymous: 404, technician: 404, author: 404, reviewer: 404, admin: 404 },
  },
  {
    method: 'post',
    path: '/auth/set-password',
    probe: { body: { token: NEVER_ISSUED, password: 'a long and unlisted bench phrase' } },
    expect: { anonymous: 404, technician: 404, author: 404, reviewer: 404, admin: 404 },
  },

  // One's own account: anyone signed in, for themselves only (there is no id to point elsewhere).
  {
    method: 'get',
    path: '/auth/account',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/auth/password',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 400, author: 400, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/auth/sign-out-everywhere',
    probe: { freshSession: true, endsEverySession: true },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/auth/sign-in/code',
    probe: { body: {} },
    expect: { anonymous: 400, technician: 400, author: 400, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/auth/totp/setup',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 400, author: 400, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/auth/totp/confirm',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 400, author: 400, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/auth/totp/recovery-codes',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 400, author: 400, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/auth/totp/disable',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 400, author: 400, reviewer: 400, admin: 400 },
  },

  // People: admin only.
  {
    method: 'get',
    path: '/people',
    probe: {},
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 200 },
  },
  {
    method: 'post',
    path: '/people/invitations',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 400 },
  },
  {
    method: 'patch',
    path: '/people/:id',
    probe: { params: { id: 'randomId' }, body: { displayName: 'Nobody' } },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 404 },
  },
  {
    method: 'post',
    path: '/people/:id/password-reset',
    probe: { params: { id: 'randomId' } },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 404 },
  },
  {
    method: 'post',
    path: '/people/:id/second-factor-reset',
    probe: { params: { id: 'randomId' } },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 404 },
  },
  {
    method: 'get',
    path: '/settings/sign-in',
    probe: {},
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 200 },
  },
  {
    method: 'put',
    path: '/settings/sign-in',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 400 },
  },

  // Procedures and drafts: everyone reads what they may see; only authors write.
  {
    method: 'get',
    path: '/procedures',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'get',
    path: '/procedures/facets',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/procedures',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 403, author: 400, reviewer: 403, admin: 403 },
  },
  {
    method: 'get',
    path: '/procedures/:id',
    probe: { params: { id: 'approvedProcedure' } },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/procedures/:id/drafts',
    probe: { params: { id: 'randomId' } },
    expect: { anonymous: 401, technician: 403, author: 404, reviewer: 403, admin: 403 },
  },
  {
    method: 'get',
    path: '/revisions/:id',
    probe: { params: { id: 'approvedRevision' } },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'put',
    path: '/revisions/:id',
    probe: { params: { id: 'inReviewRevision' }, body: {} },
    expect: { anonymous: 401, technician: 403, author: 400, reviewer: 403, admin: 403 },
  },

  // Attachments: authors upload files into procedures; anyone signed in downloads.
  {
    method: 'post',
    path: '/attachments',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 403, author: 400, reviewer: 403, admin: 403 },
  },
  {
    method: 'get',
    path: '/attachments/:id',
    probe: { params: { id: 'randomId' } },
    expect: { anonymous: 401, technician: 404, author: 404, reviewer: 404, admin: 404 },
  },

  // Search of approved procedures: the whole team.
  {
    method: 'get',
    path: '/search',
    probe: { query: { q: 'fuse' } },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },

  // Review: reviewers decide; authors see their review; admins may read it (they read the audit trail anyway).
  {
    method: 'get',
    path: '/review/queue',
    probe: {},
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 200, admin: 403 },
  },
  {
    method: 'get',
    path: '/revisions/:id/review',
    probe: { params: { id: 'inReviewRevision' } },
    expect: { anonymous: 401, technician: 403, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/revisions/:id/submit',
    probe: { params: { id: 'randomId' }, body: { changeReason: 'Probe.' } },
    expect: { anonymous: 401, technician: 403, author: 404, reviewer: 403, admin: 403 },
  },
  {
    method: 'post',
    path: '/revisions/:id/approve',
    probe: { params: { id: 'inReviewRevision' }, body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 400, admin: 403 },
  },
  {
    method: 'post',
    path: '/revisions/:id/return',
    probe: { params: { id: 'inReviewRevision' }, body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 400, admin: 403 },
  },
  // The home page: everyone signed in gets what waits for them (sections by their roles).
  {
    method: 'get',
    path: '/home',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  // Periodic review: the list of revisions due is for reviewers, and admins who keep the shop's records.
  {
    method: 'get',
    path: '/review/due',
    probe: {},
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 200, admin: 200 },
  },
  // Read before you run: technicians read what changed and acknowledge it; reviewers (and admins) see who has.
  {
    method: 'get',
    path: '/revisions/:id/acknowledgement',
    probe: { params: { id: 'approvedRevision' } },
    expect: { anonymous: 401, technician: 200, author: 403, reviewer: 403, admin: 403 },
  },
  {
    method: 'post',
    path: '/revisions/:id/acknowledge',
    probe: { params: { id: 'approvedRevision' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 403 },
  },
  {
    method: 'get',
    path: '/revisions/:id/acknowledgements',
    probe: { params: { id: 'approvedRevision' } },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 200, admin: 200 },
  },
  // Taking a procedure out of use is a signed decision for a reviewer, or an admin acting for the shop.
  {
    method: 'post',
    path: '/procedures/:id/withdraw',
    probe: { params: { id: 'approvedProcedure' }, body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/revisions/:id/comments',
    probe: { params: { id: 'randomId' }, body: { body: 'Check the standby switch.' } },
    expect: { anonymous: 401, technician: 403, author: 404, reviewer: 404, admin: 403 },
  },
  {
    method: 'get',
    path: '/revisions/:id/signatures',
    probe: { params: { id: 'approvedRevision' } },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'get',
    path: '/signatures/:id/verify',
    probe: { params: { id: 'approvalSignature' } },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },

  // Records the admin keeps.
  {
    method: 'get',
    path: '/audit/chain',
    probe: {},
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 200 },
  },
  {
    method: 'get',
    path: '/audit',
    probe: {},
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 200 },
  },
  {
    method: 'get',
    path: '/mail/outbox',
    probe: {},
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 200 },
  },
  {
    method: 'get',
    path: '/openapi.json',
    probe: {},
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 403, admin: 200 },
  },

  // The unit register: kept by everyone who works at the bench or writes about units.
  {
    method: 'get',
    path: '/units',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/units',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 400, author: 400, reviewer: 400, admin: 400 },
  },
  {
    method: 'get',
    path: '/units/:id',
    probe: { params: { id: 'unit' } },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'put',
    path: '/units/:id',
    probe: { params: { id: 'unit' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 400, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/units/:id/photos',
    probe: { params: { id: 'unit' } },
    expect: { anonymous: 401, technician: 400, author: 400, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/units/:id/state',
    probe: { params: { id: 'unit' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 400, admin: 400 },
  },
  {
    method: 'get',
    path: '/units/:id/trend',
    probe: { params: { id: 'unit' } },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },

  // Bench runs: technicians run and sign; everyone signed in reads them (authors hear about out-of-tolerance runs).
  {
    method: 'get',
    path: '/runs',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/runs',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 403 },
  },
  {
    method: 'get',
    path: '/runs/:id',
    probe: { params: { id: 'run' } },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'put',
    path: '/runs/:id/entries/:stepId',
    probe: { params: { id: 'run', stepId: 'runStep' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 403 },
  },
  {
    method: 'post',
    path: '/runs/:id/photos',
    probe: { params: { id: 'run' } },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 403 },
  },
  {
    method: 'post',
    path: '/runs/:id/sign',
    probe: { params: { id: 'run' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 403 },
  },
  {
    method: 'post',
    path: '/runs/:id/release',
    probe: { params: { id: 'run' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 400, admin: 403 },
  },
  // A technician asks whether they may run a revision alone; a named witness (a qualified technician) co-signs.
  {
    method: 'get',
    path: '/runs/eligibility',
    probe: {},
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 403 },
  },
  {
    method: 'post',
    path: '/runs/:id/witness',
    probe: { params: { id: 'run' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 403 },
  },
  // A run changes hands, or is closed as abandoned, by its performer (a technician) or by an admin when the performer is away.
  {
    method: 'get',
    path: '/runs/technicians',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 403, reviewer: 403, admin: 200 },
  },
  {
    method: 'post',
    path: '/runs/:id/handover',
    probe: { params: { id: 'run' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 400 },
  },
  {
    method: 'post',
    path: '/runs/:id/abandon',
    probe: { params: { id: 'run' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 400 },
  },
  // Hold points and deviations: the performer (a technician) records a step as not applicable or a
  // deviation; a senior (reviewer or admin) decides holds and deviations and lists what waits.
  {
    method: 'get',
    path: '/runs/awaiting-decision',
    probe: {},
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/runs/:id/holds/:holdId/decision',
    probe: { params: { id: 'run', holdId: 'randomId' }, body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/runs/:id/exceptions',
    probe: { params: { id: 'run' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 403 },
  },
  {
    method: 'post',
    path: '/runs/:id/exceptions/:exceptionId/decision',
    probe: { params: { id: 'run', exceptionId: 'randomId' }, body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 400, admin: 400 },
  },
  {
    method: 'get',
    path: '/runs/:id/sheet.pdf',
    probe: { params: { id: 'run' } },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  // Blank bench sheets: everyone signed in reads approved revisions, so prints them; only the run's
  // performer (a technician) says its readings are copied from one.
  {
    method: 'get',
    path: '/revisions/:id/bench-sheet.pdf',
    probe: { params: { id: 'approvedRevision' }, query: { mainsVoltage: '236' } },
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'put',
    path: '/runs/:id/paper-sheet',
    probe: { params: { id: 'run' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 403, admin: 403 },
  },

  // The registers of instruments and qualifications: everyone signed in reads them; reviewers and admins keep them.
  {
    method: 'get',
    path: '/instruments',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/instruments',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 400, admin: 400 },
  },
  {
    method: 'put',
    path: '/instruments/:id',
    probe: { params: { id: 'randomId' }, body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/instruments/:id/certificate',
    probe: { params: { id: 'randomId' } },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 404, admin: 404 },
  },
  {
    method: 'get',
    path: '/qualifications',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/qualifications',
    probe: { body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/qualifications/:id/withdraw',
    probe: { params: { id: 'randomId' }, body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 400, admin: 400 },
  },

  // Follow-ups of out-of-band runs: everyone signed in reads them.
  {
    method: 'get',
    path: '/follow-ups',
    probe: {},
    expect: { anonymous: 401, technician: 200, author: 200, reviewer: 200, admin: 200 },
  },
  {
    method: 'post',
    path: '/follow-ups/:id/disposition',
    probe: { params: { id: 'randomId' }, body: {} },
    expect: { anonymous: 401, technician: 400, author: 403, reviewer: 400, admin: 400 },
  },
  {
    method: 'post',
    path: '/follow-ups/:id/owner',
    probe: { params: { id: 'randomId' }, body: {} },
    expect: { anonymous: 401, technician: 403, author: 403, reviewer: 400, admin: 400 },
  },
];
