export const registerKeys = {
  instruments: ['instruments'] as const,
  qualifications: (all: boolean) => ['qualifications', all ? 'all' : 'active'] as const,
  qualificationsAll: ['qualifications'] as const,
  eligibility: (revisionId: string) => ['runs', 'eligibility', revisionId] as const,
};
