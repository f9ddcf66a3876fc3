import { parseQuantity, QuantityParseError } from '../../../units/parse';
import type { BlockSnapshot } from '../../evaluate';
import { isLiveCheck, isLiveReading, type HazardFlag } from '../../schema';
import type { Finding, Rule } from '../types';
import { capitalise, checkStepName, readingName, reckonerName, volts } from '../words';

/** Voltages written in running text: "495 V", "0.4 kV", "300 VAC", "6V3". Each read by the one parser. */
const VOLTAGE =
  /(?<![\w.,])[-\u2212]?\d+(?:\.\d+)?\s?(?:k|m)?V(?:\d+)?(?:\s?(?:AC|DC|ac|dc|rms|pk|peak|pp|p-p))?(?![\w])/g;

export function voltagesIn(text: string): number[] {
  const out: number[] = [];
  for (const m of text.matchAll(VOLTAGE)) {
    try {
      out.push(Math.abs(parseQuantity(m[0].replace('\u2212', '-'), 'V').value));
    } catch (e) {
      if (!(e instanceof QuantityParseError)) throw e;
    }
  }
  return out;
}

/** Highest voltage a reckoner block gives (outputs in V), 0 for a block with errors. */
function blockVolts(block: BlockSnapshot): number {
  let max = 0;
  if (block.ok)
    for (const out of Object.values(block.outputs))
      if (out.unit === 'V' && typeof out.value === 'number') max = Math.max(max, Math.abs(out.value));
  return max;
}

/**
 * A hazardous voltage — a reckoner's output, a reading's expected value, or a figure written in a
 * check step — needs a hazard note before it in its own section: the note says what is dangerous
 * where the danger is, not only once at the top.
 */
export const hazardNoteMissing: Rule = {
  code: 'hazard-note-missing',
  level: 'danger',
  run(ctx) {
    const limit = ctx.options.safeVoltage;
    const out: Finding[] = [];
    const need = (at: { id: string; section: string; order: number }, says: string, v: number) => {
      if (v > limit && ctx.notesBefore(at).length === 0) {
        out.push({
          blockId: at.id,
          message: `${capitalise(says)} ${volts(v)}, above the ${volts(limit)} DC safe voltage, but no hazard note comes before it in its section.`,
        });
      }
    };
    const placed = new Map(ctx.blocks.reckoners.map((r) => [r.id, r]));
    for (const block of ctx.snapshot.blocks) {
      const at = placed.get(block.id);
      if (at) need(at, `${reckonerName(block)} gives`, blockVolts(block));
    }
    const expected = new Map(ctx.snapshot.readings.map((r) => [r.id, r]));
    for (const r of ctx.blocks.readings) {
      const e = expected.get(r.id);
      if (r.unit === 'V' && e?.expected != null) need(r, `${readingName(r)} expects`, Math.abs(e.expected));
    }
    for (const c of ctx.blocks.checkSteps)
      need(c, `${checkStepName(c)} states`, Math.max(0, ...voltagesIn(c.text)));
    return out;
  },
};

const ONE_HAND: HazardFlag[] = ['oneHand'];
const BRING_UP: HazardFlag[] = ['isolation', 'currentLimited'];

/**
 * A live step — a check step marked live, or a reading live by its unit or by mark — needs hazard
 * notes governing it (earlier in its section, or at the top of the procedure) whose flags state the
 * live-work cautions: work one-handed, and bring the unit up isolated or current-limited. Text alone
 * does not count: a note about a hot soldering iron is not one about live work.
 */
export const liveStepUnguarded: Rule = {
  code: 'live-step-unguarded',
  level: 'danger',
  run(ctx) {
    const out: Finding[] = [];
    for (const s of ctx.steps) {
      const live = s.type === 'check' ? isLiveCheck(s.step) : isLiveReading(s.step);
      if (!live) continue;
      const flags = ctx.flagsInScope(s.step);
      const missing = [
        !ONE_HAND.some((f) => flags.has(f)) && 'work one hand only',
        !BRING_UP.some((f) => flags.has(f)) &&
          'bring the unit up through an isolation transformer or current-limited',
      ].filter(Boolean);
      if (!missing.length) continue;
      const name = s.type === 'check' ? checkStepName(s.step) : readingName(s.step);
      out.push({
        blockId: s.step.id,
        message: `${capitalise(name)} is live work, but no hazard note before it (in its section or at the top of the procedure) is marked: ${missing.join('; ')}.`,
      });
    }
    return out;
  },
};
