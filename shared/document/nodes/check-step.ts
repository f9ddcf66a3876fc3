import { z } from 'zod';
import { parseQuantity, QuantityParseError } from '../../units/parse';
import { added, blockId, defineNode, esc, shortText, yesNo } from './define';

/** The highest threshold a discharge-verified step may name; above it the value is a slip, not a choice. */
const MAX_DISCHARGE_THRESHOLD = 1000;

/** A threshold voltage as typed ("60 V", "50 VDC"): a positive DC voltage. */
const thresholdText = z
  .string()
  .max(40, 'at most 40 characters')
  .superRefine((text, ctx) => {
    let q;
    try {
      q = parseQuantity(text, 'V');
    } catch (e) {
      if (!(e instanceof QuantityParseError)) throw e;
      ctx.addIssue({
        code: 'custom',
        message: `"${text.slice(0, 40)}" is not a voltage; write it as "60 V"`,
      });
      return;
    }
    if (!(q.value > 0) || q.value > MAX_DISCHARGE_THRESHOLD) {
      ctx.addIssue({
        code: 'custom',
        message: `must be a voltage above 0 V and at most ${MAX_DISCHARGE_THRESHOLD} V`,
      });
    } else if (q.measure && q.measure !== 'dc') {
      ctx.addIssue({
        code: 'custom',
        message: 'is a DC voltage on the discharged capacitors; write it without rms or peak',
      });
    }
  });

/**
 * What a check step asks for. Absent means 'confirm' (every step stored before the kinds existed):
 * - confirm: the technician confirms something by ticking it;
 * - discharge-verified: the filter capacitors are measured below `threshold` before anyone touches;
 * - wait: the technician waits `seconds` before going on. `drain` says what empties the capacitors
 *   meanwhile: the unit's own bleeder (the default), a discharge probe held on each node, or nothing
 *   (a wait for warming up or settling, not for discharge).
 */
export const CHECK_KINDS = ['confirm', 'discharge-verified', 'wait'] as const;
export type CheckKind = (typeof CHECK_KINDS)[number];
export const WAIT_DRAINS = ['bleeder', 'probe', 'none'] as const;
export type WaitDrain = (typeof WAIT_DRAINS)[number];

export const checkStepAttrs = z
  .object({
    id: blockId,
    text: shortText(500),
    kind: added(z.enum(CHECK_KINDS, { error: `must be one of: ${CHECK_KINDS.join(', ')}` })),
    threshold: added(thresholdText),
    seconds: added(
      z
        .number({ error: 'must be a number of seconds' })
        .refine(Number.isFinite, 'must be a finite number of seconds')
        .pipe(z.number().gt(0, 'must be more than 0 s').max(86_400, 'must be at most 86 400 s (a day)')),
    ),
    drain: added(z.enum(WAIT_DRAINS, { error: `must be one of: ${WAIT_DRAINS.join(', ')}` })),
    /** Done on a powered unit. */
    live: yesNo(),
  })
  .strict()
  .superRefine((a, ctx) => {
    const kind = a.kind ?? 'confirm';
    const only = (key: 'threshold' | 'seconds' | 'drain', owner: CheckKind) => {
      if (a[key] !== undefined && kind !== owner)
        ctx.addIssue({
          code: 'custom',
          path: [key],
          message: `only a ${owner} step takes ${key === 'seconds' ? 'a duration' : `a ${key}`}`,
        });
    };
    only('threshold', 'discharge-verified');
    only('seconds', 'wait');
    only('drain', 'wait');
    if (kind === 'discharge-verified' && a.threshold === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['threshold'],
        message: 'a discharge-verified step needs the voltage it verifies below, e.g. "60 V"',
      });
    }
    if (kind === 'wait' && a.seconds === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['seconds'],
        message: 'a wait step needs its duration in seconds',
      });
    }
  });
export type CheckStepAttrs = z.infer<typeof checkStepAttrs>;

export const isLiveCheck = (c: Pick<CheckStepAttrs, 'live'>): boolean => c.live === true;
export const checkKindOf = (c: Pick<CheckStepAttrs, 'kind'>): CheckKind => c.kind ?? 'confirm';

/** "Check", "Wait 10 s (bleeder)", "Discharge verified below 60 V", with "live" where marked: one wording for text, reader and run. */
export function checkStepHeading(a: CheckStepAttrs): string {
  const kind = checkKindOf(a);
  const head =
    kind === 'discharge-verified'
      ? `Discharge verified below ${a.threshold ?? 'its threshold'}`
      : kind === 'wait'
        ? `Wait ${a.seconds} s${a.drain === 'probe' ? ' per node on the discharge probe' : a.drain === 'none' ? '' : ' for the bleeder'}`
        : 'Check';
  return a.live ? `${head} (live)` : head;
}

/** A plain confirmation shows only its text; a structured or live step leads with its heading. */
export const showsHeading = (a: CheckStepAttrs) => checkKindOf(a) !== 'confirm' || isLiveCheck(a);

export const checkStep = defineNode({
  attrs: checkStepAttrs,
  content: 'none',
  label: 'check step',
  many: 'checkSteps',
  // Unset structured attributes stay null; the schema reads null as "not stated".
  defaults: { id: '', text: '', kind: null, threshold: null, seconds: null, drain: null, live: null },
  text: (a) => [`${checkStepHeading(a)}: ${a.text}`],
  html: (a) => {
    const head = showsHeading(a) ? `<strong>${esc(checkStepHeading(a))}:</strong> ` : '';
    return `<p class="check-step">☐ ${head}${esc(a.text)}</p>`;
  },
  step: (a, { section, position }) => ({
    id: a.id,
    kind: 'check',
    position,
    section,
    text: a.text,
    ...(showsHeading(a)
      ? {
          check: {
            kind: checkKindOf(a),
            heading: checkStepHeading(a),
            ...(a.threshold ? { threshold: a.threshold } : {}),
            ...(a.seconds ? { seconds: a.seconds } : {}),
          },
        }
      : {}),
    ...(isLiveCheck(a) ? { live: true } : {}),
  }),
});
