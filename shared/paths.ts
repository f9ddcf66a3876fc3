/** Every client URL once: the route pattern and a builder for links. The client routes by it; the server links to it from mail. */
export const paths = {
  home: { pattern: '/', href: () => '/' },
  signIn: {
    pattern: '/sign-in',
    href: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'),
  },
  setPassword: { pattern: '/set-password/:token', href: (token: string) => `/set-password/${token}` },
  people: { pattern: '/admin/people', href: () => '/admin/people' },
  account: { pattern: '/account', href: () => '/account' },
  search: {
    pattern: '/search',
    href: (q?: string) => (q ? `/search?q=${encodeURIComponent(q)}` : '/search'),
  },
  procedures: { pattern: '/procedures', href: () => '/procedures' },
  newProcedure: { pattern: '/procedures/new', href: () => '/procedures/new' },
  procedure: { pattern: '/procedures/:procedureId', href: (id: string) => `/procedures/${id}` },
  revision: { pattern: '/revisions/:revisionId', href: (id: string) => `/revisions/${id}` },
  editRevision: { pattern: '/revisions/:revisionId/edit', href: (id: string) => `/revisions/${id}/edit` },
  acknowledgeRevision: {
    pattern: '/revisions/:revisionId/acknowledge',
    href: (id: string) => `/revisions/${id}/acknowledge`,
  },
  reviewQueue: { pattern: '/review', href: () => '/review' },
  reviewDue: { pattern: '/review/due', href: () => '/review/due' },
  reviewRevision: {
    pattern: '/review/revisions/:revisionId',
    href: (id: string) => `/review/revisions/${id}`,
  },
  audit: { pattern: '/admin/audit', href: () => '/admin/audit' },
  outbox: { pattern: '/admin/outbox', href: () => '/admin/outbox' },
  apiReference: { pattern: '/admin/api', href: () => '/admin/api' },
  units: { pattern: '/units', href: () => '/units' },
  unit: { pattern: '/units/:unitId', href: (id: string) => `/units/${id}` },
  runs: { pattern: '/runs', href: () => '/runs' },
  newRun: {
    pattern: '/runs/new',
    href: (unitId?: string, revisionId?: string) => {
      const q = new URLSearchParams();
      if (unitId) q.set('unit', unitId);
      if (revisionId) q.set('revision', revisionId);
      return q.size ? `/runs/new?${q}` : '/runs/new';
    },
  },
  runDecisions: { pattern: '/runs/decisions', href: () => '/runs/decisions' },
  run: { pattern: '/runs/:runId', href: (id: string) => `/runs/${id}` },
  runSheet: { pattern: '/runs/:runId/sheet', href: (id: string) => `/runs/${id}/sheet` },
  instruments: { pattern: '/instruments', href: () => '/instruments' },
  qualifications: { pattern: '/qualifications', href: () => '/qualifications' },
  followUps: { pattern: '/follow-ups', href: () => '/follow-ups' },
} as const;
