import { inputLabel } from '@shared/document/block-view';
import { extractBlocks, plainText } from '@shared/document/extract';
import { PARAM_SPECS } from '@shared/document/params';
import { eachField, isParam, isRef } from '@shared/reckoners/field-paths';
import { getReckoner, type FieldSpec } from '@shared/reckoners';
import { formatQuantity } from '@shared/units';
import type { DraftFields } from './draft-fields';

/** One field the two versions disagree on, named as the form labels it, each value in words. */
export interface DraftDifference {
  label: string;
  yours: string;
  saved: string;
}

const NONE = '—';

type Block = ReturnType<typeof extractBlocks>['reckoners'][number];

/** A block's input as the author typed or linked it: "6.3 V", "the Nominal mains parameter", "a result of the Mains fuse block". */
function inputWords(spec: FieldSpec, value: unknown, blocks: Block[]): string {
  if (value === undefined || value === null || value === '') return NONE;
  if (isRef(value)) {
    const target = blocks.find((b) => b.name === value.ref.slice(0, value.ref.indexOf('.')));
    return `a result of the ${(target && getReckoner(target.kind)?.label) ?? 'other'} block`;
  }
  if (isParam(value))
    return `the ${PARAM_SPECS.find((p) => p.key === value.param)?.label ?? 'procedure'} parameter`;
  if (typeof value === 'number') return spec.unit ? formatQuantity(value, spec.unit, 4) : String(value);
  if (spec.kind === 'select') return spec.options?.find((o) => o.value === value)?.label ?? String(value);
  return typeof value === 'string' ? value : JSON.stringify(value);
}

/** Every input of a block by its label ("Winding 1 voltage") with its value in words. */
function blockInputs(block: Block | undefined, blocks: Block[]): Map<string, string> {
  const out = new Map<string, string>();
  const fields = block ? (getReckoner(block.kind)?.fields ?? []) : [];
  if (block)
    eachField(fields, block.inputs ?? {}, (spec, path, value) =>
      out.set(inputLabel(fields, path), inputWords(spec, value, blocks)),
    );
  return out;
}

/** Where a block stands in the draft, for people: "Mains fuse block 1". */
function blockTitle(block: Block, all: Block[]): string {
  const label = getReckoner(block.kind)?.label ?? 'Calculation';
  const same = all.filter((b) => b.kind === block.kind);
  return same.length > 1 ? `${label} block ${same.indexOf(block) + 1}` : `${label} block`;
}

/**
 * What differs between the author's version and the saved one, field by field: the details, the
 * parameters, each calculation's inputs (blocks followed by their id), and the text.
 */
export function compareDrafts(mine: DraftFields, saved: DraftFields): DraftDifference[] {
  const out: DraftDifference[] = [];
  const differ = (label: string, yours: string, theirs: string) => {
    if (yours !== theirs) out.push({ label, yours: yours || NONE, saved: theirs || NONE });
  };
  differ('Title', mine.title, saved.title);
  differ('Equipment family', mine.equipmentFamily, saved.equipmentFamily);
  differ('Model', mine.equipmentModel, saved.equipmentModel);
  differ('Tags', mine.tags.join(', '), saved.tags.join(', '));
  for (const p of PARAM_SPECS)
    differ(p.label, formatQuantity(mine.params[p.key], p.unit), formatQuantity(saved.params[p.key], p.unit));

  const a = extractBlocks(mine.document).reckoners;
  const b = extractBlocks(saved.document).reckoners;
  for (const block of [...a, ...b.filter((x) => !a.some((y) => y.id === x.id))]) {
    const yours = a.find((x) => x.id === block.id);
    const theirs = b.find((x) => x.id === block.id);
    const title = blockTitle(block, yours ? a : b);
    if (!yours || !theirs) {
      differ(title, yours ? 'added' : 'not there', theirs ? 'present' : 'not there');
      continue;
    }
    const inYours = blockInputs(yours, a);
    const inSaved = blockInputs(theirs, b);
    for (const label of new Set([...inYours.keys(), ...inSaved.keys()]))
      differ(`${title}: ${label}`, inYours.get(label) ?? NONE, inSaved.get(label) ?? NONE);
  }

  // The text: the lines only one side has, in its order.
  const linesA = plainText(mine.document).split('\n').filter(Boolean);
  const linesB = plainText(saved.document).split('\n').filter(Boolean);
  const onlyA = linesA.filter((l) => !linesB.includes(l));
  const onlyB = linesB.filter((l) => !linesA.includes(l));
  if (onlyA.length || onlyB.length) differ('Text', onlyA.join('\n'), onlyB.join('\n'));
  return out;
}
