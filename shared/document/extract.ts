import { BLOCKS, BLOCK_TYPES, nodeDef, textOf, type AttrsOf, type BlockType, type DocNode } from './nodes';
import { walk, type ProcedureDoc } from './schema';

export { checkStepHeading, hazardFlagWords, textOf } from './nodes';

/** Where a block sits: the heading it is under ('' before the first) and its place in document order. */
export interface Placed {
  section: string;
  order: number;
}

/** A block as extracted: its attributes and place, and its text when it holds any (a hazard note). */
export type Extracted<T extends BlockType> = AttrsOf<T> &
  Placed &
  ((typeof BLOCKS)[T]['content'] extends 'none' ? unknown : { text: string });

/** The structured blocks of a document, in document order, each with the heading it sits under. */
export type DocBlocks = { [T in BlockType as (typeof BLOCKS)[T]['many']]: Extracted<T>[] };

export function extractBlocks(doc: ProcedureDoc): DocBlocks {
  const out = Object.fromEntries(BLOCK_TYPES.map((t) => [BLOCKS[t].many, []])) as Record<
    string,
    Record<string, unknown>[]
  >;
  let section = '';
  let order = 0;
  // Only top-level headings start sections; nested walking still finds blocks inside lists.
  for (const top of doc.content) {
    if (top.type === 'heading') section = textOf(top);
    walk(top, (node) => {
      const at = { section, order: order++ };
      if (!Object.prototype.hasOwnProperty.call(BLOCKS, node.type)) return;
      const type = node.type as BlockType;
      out[BLOCKS[type].many]!.push({
        ...node.attrs,
        ...at,
        ...(BLOCKS[type].content === 'none' ? {} : { text: textOf(node) }),
      });
    });
  }
  return out as unknown as DocBlocks;
}

/** Plain text of the whole document for search and diffs: one line per block. */
export function plainText(doc: ProcedureDoc): string {
  const lines = (node: DocNode): string[] => {
    const inner = () => (node.content ?? []).flatMap(lines);
    const text = nodeDef(node.type)?.text;
    return text ? text(node.attrs as never, node, inner) : inner();
  };
  return lines(doc)
    .filter((l) => l.trim())
    .join('\n');
}
