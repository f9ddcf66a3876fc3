/** "3 h", "2 d": how long something has waited, for the review queue. */
export function formatAge(seconds: number) {
  if (seconds < 90) return `${Math.max(1, Math.round(seconds))} s`;
  if (seconds < 5400) return `${Math.round(seconds / 60)} min`;
  if (seconds < 172_800) return `${Math.round(seconds / 3600)} h`;
  return `${Math.round(seconds / 86_400)} d`;
}

/** Signatures are shown in UTC, as recorded by the database, with the zone named. */
export const formatUtc = (iso: string) => `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;

export const MEANING_LABELS = { approved: 'Approved', returned: 'Returned', withdrawn: 'Withdrawn' } as const;
