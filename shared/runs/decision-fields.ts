/** The run sheet's lines for hold points reached and steps recorded as not applicable or a deviation. */
import type { RunView } from '../schemas/runs';
import { STEP_EXCEPTION_WORDS } from '../schemas/run-decisions';
import { formatQuantity } from '../units/format';
import type { SheetField } from './run-sheet-model';

const utc = (iso: string | null) => (iso ? `${iso.slice(0, 19).replace('T', ' ')} UTC` : '—');

export function decisionFields(run: Pick<RunView, 'holdPoints' | 'exceptions'>): SheetField[] {
  const holds = (run.holdPoints ?? []).map((h): SheetField => {
    const band =
      h.low !== null && h.high !== null
        ? `${formatQuantity(h.low, h.unit, 4)} … ${formatQuantity(h.high, h.unit, 4)}`
        : 'no band';
    const reached = `${h.position}. ${h.text}: measured ${h.raw}, expected ${band}, ${utc(h.openedAt)}.`;
    return {
      label: 'Hold point',
      value: h.decision
        ? `${reached} ${h.decidedBy?.displayName} decided to ${h.decision === 'continue' ? 'continue' : 'abandon the run'}, ${utc(h.decidedAt)}: ${h.reason}`
        : `${reached} Waiting for a senior's decision.`,
      tone: h.decision === 'continue' ? undefined : 'out',
      tag: 'hold-point',
    };
  });
  const exceptions = (run.exceptions ?? []).map((x): SheetField => {
    const recorded = `${x.position}. ${x.text}: ${x.reason} (${x.recordedBy.displayName}, ${utc(x.recordedAt)})`;
    const decided =
      x.kind !== 'deviation'
        ? ''
        : x.decision
          ? ` ${x.decision === 'approved' ? 'Approved' : 'Refused'} by ${x.decidedBy?.displayName}, ${utc(x.decidedAt)}: ${x.decisionNote}`
          : " Waiting for a senior's approval.";
    return {
      label: `${STEP_EXCEPTION_WORDS[x.kind]}${x.current ? '' : ' (replaced)'}`,
      value: `${recorded}.${decided}`,
      tone: x.kind === 'deviation' && x.decision !== 'approved' ? 'out' : undefined,
      tag: 'step-record',
    };
  });
  return [...holds, ...exceptions];
}

/** How a step's current record reads in its own row ("not applicable", "deviation, approved"), or null. */
export function recordStatus(run: Pick<RunView, 'exceptions'>, stepId: string): string | null {
  const x = run.exceptions?.find((r) => r.stepId === stepId && r.current);
  if (!x) return null;
  if (x.kind === 'not_applicable') return 'not applicable (see below)';
  return `deviation, ${x.decision === 'approved' ? 'approved' : x.decision === 'refused' ? 'refused' : 'waiting for approval'} (see below)`;
}
