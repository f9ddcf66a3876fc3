import { evaluateDocument, type Snapshot } from '../evaluate';
import { extractBlocks, type Placed } from '../extract';
import { HAZARD_FLAGS, type HazardFlag, type ProcedureDoc } from '../schema';
import type { CheckContext, CheckedNote, CheckOptions } from './types';

/** Notes above the first heading open the procedure and govern every section below them. */
const OPENING = '';

export function buildContext(doc: ProcedureDoc, snapshot: Snapshot, options: CheckOptions): CheckContext {
  const blocks = extractBlocks(doc);
  const steps = [
    ...blocks.checkSteps.map((step) => ({ type: 'check' as const, step })),
    ...blocks.readings.map((step) => ({ type: 'reading' as const, step })),
  ].sort((a, b) => a.step.order - b.step.order);

  const notesBefore = (at: Placed): CheckedNote[] =>
    blocks.hazardNotes.filter((n) => n.section === at.section && n.order < at.order);
  const flagsInScope = (at: Placed) => {
    const opening = blocks.hazardNotes.filter((n) => n.section === OPENING && n.order < at.order);
    const flags = new Set<HazardFlag>();
    for (const n of [...opening, ...notesBefore(at)])
      for (const f of HAZARD_FLAGS) if (n.flags?.[f]) flags.add(f);
    return flags;
  };

  let high: Snapshot | undefined;
  const atHighMains = () =>
    (high ??= evaluateDocument(doc, {
      ...snapshot.params,
      mainsVoltage: snapshot.params.mainsNominal * (1 + options.highMainsPercent / 100),
    }));

  return { doc, snapshot, options, blocks, steps, notesBefore, flagsInScope, atHighMains };
}
