import { extractBlocks, plainText } from '@shared/document/extract';
import type { DraftFields } from './draft-fields';

/** A draft as plain lines for side-by-side comparison: details, then the text, reckoners by name. */
export function draftLines(d: DraftFields): string[] {
  const { reckoners } = extractBlocks(d.document);
  return [
    `Title: ${d.title}`,
    `Equipment: ${d.equipmentFamily} ${d.equipmentModel}`,
    `Tags: ${d.tags.join(', ')}`,
    `Mains: ${d.params.mainsNominal} V nominal, ${d.params.mainsFrequency} Hz`,
    ...reckoners.map((r) => `Reckoner ${r.name} (${r.kind}): ${JSON.stringify(r.inputs)}`),
    ...plainText(d.document).split('\n'),
  ];
}

export interface DraftComparison {
  mine: { line: string; only: boolean }[];
  theirs: { line: string; only: boolean }[];
  summary: string[];
}

export function compareDrafts(mine: DraftFields, theirs: DraftFields): DraftComparison {
  const a = draftLines(mine);
  const b = draftLines(theirs);
  const inA = new Set(a);
  const inB = new Set(b);
  const count = (d: DraftFields) => {
    const x = extractBlocks(d.document);
    return `${x.reckoners.length} reckoners, ${x.readings.length} readings, ${x.checkSteps.length} check steps, ${x.hazardNotes.length} hazard notes`;
  };
  const onlyMine = a.filter((l) => !inB.has(l)).length;
  const onlyTheirs = b.filter((l) => !inA.has(l)).length;
  return {
    mine: a.map((line) => ({ line, only: !inB.has(line) })),
    theirs: b.map((line) => ({ line, only: !inA.has(line) })),
    summary: [
      `Yours: ${count(mine)}; ${onlyMine} line${onlyMine === 1 ? '' : 's'} not in the saved version.`,
      `Saved: ${count(theirs)}; ${onlyTheirs} line${onlyTheirs === 1 ? '' : 's'} not in yours.`,
    ],
  };
}
