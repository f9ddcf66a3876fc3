import type { Rule } from '../types';
import { capitalise, readingName } from '../words';

export const readingWithoutTolerance: Rule = {
  code: 'reading-without-tolerance',
  level: 'warning',
  run: ({ snapshot }) =>
    snapshot.readings
      .filter((r) => !r.toleranceText.trim())
      .map((r) => ({ blockId: r.id, message: `${capitalise(readingName(r))} has no tolerance.` })),
};

export const readingUnresolved: Rule = {
  code: 'reading-unresolved',
  level: 'warning',
  run: ({ snapshot }) =>
    snapshot.readings
      .filter((r) => r.toleranceText.trim() && r.error)
      .map((r) => ({ blockId: r.id, message: `${capitalise(readingName(r))}: ${r.error}.` })),
};

/**
 * A voltage typed as a number must say whether it moves with the mains: at a bench run the
 * expected band of a reading that follows the mains is rescaled to the measured mains, a fixed
 * one (a regulated rail, the mains itself) is not. Unstated, it stays fixed — right only by luck.
 */
export const readingMainsUnstated: Rule = {
  code: 'reading-mains-unstated',
  level: 'warning',
  run: ({ blocks }) =>
    blocks.readings
      .filter((r) => r.unit === 'V' && 'literal' in r.expected && r.followsMains == null)
      .map((r) => ({
        blockId: r.id,
        message: `${capitalise(readingName(r))} expects a typed ${'literal' in r.expected ? r.expected.literal : ''} but does not say whether it follows the mains, so it will not follow the bench mains. Mark it as following the mains (a winding, or a rail fed from one) or as fixed (a regulated rail, the mains itself).`,
      })),
};

/** A hold point stops the run only on a reading outside its band: without a band it could never stop it. */
export const holdPointWithoutBand: Rule = {
  code: 'hold-point-without-band',
  level: 'warning',
  run: ({ blocks, snapshot }) =>
    blocks.readings
      .filter((r) => r.holdPoint === true)
      .filter((r) => {
        const s = snapshot.readings.find((x) => x.id === r.id);
        return !s || s.low === null || s.high === null;
      })
      .map((r) => ({
        blockId: r.id,
        message: `${capitalise(readingName(r))} is a hold point but has no expected band, so no reading there can stop the run. Give it an expected value and a tolerance.`,
      })),
};
