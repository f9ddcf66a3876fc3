import { parseQuantity, QuantityParseError } from '../../../units/parse';
import { formatQuantity } from '../../../units/format';
import { checkKindOf, isLiveCheck, isLiveReading } from '../../schema';
import type { CheckContext, Finding, Rule } from '../types';
import { capitalise, checkStepName, readingName, reckonerName, volts } from '../words';
import { voltagesIn } from './hazard';

const dischargeSteps = (ctx: CheckContext) =>
  ctx.blocks.checkSteps.filter((c) => checkKindOf(c) === 'discharge-verified');
/** The threshold in volts; NaN while the editor holds one that is not a voltage yet (the validation names it). */
function thresholdOf(threshold: string | null | undefined): number {
  try {
    return threshold ? parseQuantity(threshold, 'V').value : NaN;
  } catch (e) {
    if (e instanceof QuantityParseError) return NaN;
    throw e;
  }
}

/** Whether anything in the procedure is above the safe voltage: a block's output, a reading, a figure in a check step. */
function anyHazardousVoltage(ctx: CheckContext): boolean {
  const limit = ctx.options.safeVoltage;
  const blockHigh = ctx.snapshot.blocks.some(
    (b) =>
      b.ok &&
      Object.values(b.outputs).some(
        (o) => o.unit === 'V' && typeof o.value === 'number' && Math.abs(o.value) > limit,
      ),
  );
  const readingHigh = ctx.snapshot.readings.some(
    (r) => r.unit === 'V' && r.expected !== null && Math.abs(r.expected) > limit,
  );
  return (
    blockHigh || readingHigh || ctx.blocks.checkSteps.some((c) => voltagesIn(c.text).some((v) => v > limit))
  );
}

/**
 * Live work ends with the capacitors measured discharged: a discharge-verified check step must come
 * after the last live step. A procedure with no live step but a hazardous voltage still needs one.
 */
export const dischargeCheckMissing: Rule = {
  code: 'discharge-check-missing',
  level: 'danger',
  run(ctx) {
    const verified = dischargeSteps(ctx);
    const live = ctx.steps.filter((s) => (s.type === 'check' ? isLiveCheck(s.step) : isLiveReading(s.step)));
    const last = live.at(-1);
    if (last) {
      if (verified.some((v) => v.order > last.step.order)) return [];
      const name = last.type === 'check' ? checkStepName(last.step) : readingName(last.step);
      return [
        {
          blockId: last.step.id,
          message: `No discharge-verified check step follows the last live step, ${name}: end the live work by measuring the capacitors below ${volts(ctx.options.safeVoltage)} before anyone touches the unit.`,
        },
      ];
    }
    if (verified.length === 0 && anyHazardousVoltage(ctx)) {
      return [
        {
          blockId: null,
          message: `The procedure reaches above ${volts(ctx.options.safeVoltage)} DC, but no discharge-verified check step confirms the capacitors are measured discharged.`,
        },
      ];
    }
    return [];
  },
};

/** A discharge-verified step may not verify below more than the shop's safe voltage. */
export const dischargeThresholdHigh: Rule = {
  code: 'discharge-threshold-high',
  level: 'danger',
  run(ctx) {
    const limit = ctx.options.safeVoltage;
    return dischargeSteps(ctx)
      .filter((c) => thresholdOf(c.threshold) > limit)
      .map((c) => ({
        blockId: c.id,
        message: `${capitalise(checkStepName(c))} verifies the discharge below ${c.threshold}, above the shop's ${volts(limit)} DC safe voltage.`,
      }));
  },
};

/**
 * A wait that relies on the bleeder (a wait step's default) must last at least as long as every
 * bleeder reckoner says the charge takes to fall to its threshold.
 */
export const waitShorterThanBleeder: Rule = {
  code: 'wait-shorter-than-bleeder',
  level: 'danger',
  run(ctx) {
    const bleeders = ctx.snapshot.blocks.flatMap((b) => {
      const t = b.ok && b.kind === 'bleeder' ? b.outputs.timeToThreshold : undefined;
      if (!t || typeof t.value !== 'number') return [];
      const threshold = b.ok ? b.input.threshold : undefined;
      return [{ block: b, seconds: t.value, threshold: typeof threshold === 'number' ? threshold : null }];
    });
    const out: Finding[] = [];
    for (const c of ctx.blocks.checkSteps) {
      // Null is the editor's "not stated"; the document validation refuses a wait without seconds.
      if (checkKindOf(c) !== 'wait' || (c.drain ?? 'bleeder') !== 'bleeder' || c.seconds == null) continue;
      for (const b of bleeders) {
        if (c.seconds >= b.seconds) continue;
        out.push({
          blockId: c.id,
          message: `${capitalise(checkStepName(c))} waits ${formatQuantity(c.seconds, 's')}, but ${reckonerName(b.block)} needs ${formatQuantity(b.seconds, 's')} to bring the charge below ${b.threshold === null ? 'its threshold' : volts(b.threshold)}.`,
        });
      }
    }
    return out;
  },
};
