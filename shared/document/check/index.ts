/**
 * The procedure check: warnings an author sees beside the editor and a reviewer sees with a
 * revision. It reads the document's structure — check-step kinds, live marks, hazard-note flags,
 * the registry's field roles — never the wording. Each warning names the block it is about (by id)
 * so the editor can link to it. Warnings never block saving a draft, and a clean check does not
 * make a procedure safe: a qualified reviewer decides that.
 */
import { HAZARD_DC_VOLTS } from '../../standards/thresholds';
import type { Snapshot } from '../evaluate';
import type { ProcedureDoc } from '../schema';
import { buildContext } from './context';
import { capacitorRatingLow } from './rules/capacitors';
import { reckonerCautions } from './rules/cautions';
import { blockEmpty } from './rules/empty';
import { dischargeCheckMissing, dischargeThresholdHigh, waitShorterThanBleeder } from './rules/discharge';
import { hazardNoteMissing, liveStepUnguarded } from './rules/hazard';
import { fuseReckonerMissing, procedureErrors, reckonerInputErrors } from './rules/inputs';
import { partValuesDiffer } from './rules/parts';
import {
  holdPointWithoutBand,
  readingMainsUnstated,
  readingUnresolved,
  readingWithoutTolerance,
} from './rules/readings';
import type { CheckOptions, LintWarning, Rule } from './types';

export type { CheckLevel, CheckOptions, LintCode, LintWarning } from './types';

/**
 * The shop's defaults. Safe voltage 60 V DC: IEC 62368-1 (ES1 limit for DC) and IEC 60204-1 clause
 * 6.2.4 (residual voltage after disconnection). High mains +10 %: IEC 60038 gives 230 V ± 10 % at
 * the supply terminals (from memory); 120 V supplies stay inside it too.
 */
export const DEFAULT_CHECK_OPTIONS: CheckOptions = { safeVoltage: HAZARD_DC_VOLTS, highMainsPercent: 10 };

/** Every rule, in the order its warnings are listed. */
export const RULES: readonly Rule[] = [
  reckonerInputErrors,
  procedureErrors,
  hazardNoteMissing,
  liveStepUnguarded,
  blockEmpty,
  dischargeCheckMissing,
  dischargeThresholdHigh,
  waitShorterThanBleeder,
  capacitorRatingLow,
  partValuesDiffer,
  readingWithoutTolerance,
  readingUnresolved,
  readingMainsUnstated,
  holdPointWithoutBand,
  fuseReckonerMissing,
  reckonerCautions,
];

/** Runs every rule. A bare number as the third argument is the safe voltage (the older call). */
export function lintProcedure(
  doc: ProcedureDoc,
  snapshot: Snapshot,
  options: number | Partial<CheckOptions> = {},
): LintWarning[] {
  const opts: CheckOptions = {
    ...DEFAULT_CHECK_OPTIONS,
    ...(typeof options === 'number' ? { safeVoltage: options } : options),
  };
  const ctx = buildContext(doc, snapshot, opts);
  return RULES.flatMap((rule): LintWarning[] => {
    let findings;
    try {
      findings = rule.run(ctx);
    } catch (e) {
      // The editor runs the check on every keystroke: one rule tripping over a half-typed value must
      // not take the editor down, nor pass silently.
      return [
        {
          code: 'procedure-error',
          level: 'warning',
          blockId: null,
          message: `The check for ${rule.code} could not run: ${e instanceof Error ? e.message : String(e)}`,
        },
      ];
    }
    return findings.map((f) => ({
      code: rule.code,
      level: f.level ?? rule.level,
      blockId: f.blockId,
      message: f.message,
      ...(f.caution ? { caution: f.caution } : {}),
    }));
  });
}
