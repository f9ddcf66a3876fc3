import { REVISION_STATE_LABELS, type RevisionStateName } from '@shared/schemas/revision-states';

const TONE: Record<RevisionStateName, string> = {
  draft: 'border-rule bg-paper text-graphite',
  in_review: 'border-accent bg-accent-wash text-accent-deep',
  approved: 'border-ok bg-card text-ok',
  returned: 'border-out bg-out-wash text-out',
  superseded: 'border-rule bg-paper-deep text-graphite-soft',
  withdrawn: 'border-rule bg-paper-deep text-graphite-soft line-through',
};

export function StateBadge({ state }: { state: RevisionStateName }) {
  return (
    <span className={`inline-block rounded border px-2 py-0.5 text-xs font-semibold ${TONE[state]}`}>
      {REVISION_STATE_LABELS[state]}
    </span>
  );
}
