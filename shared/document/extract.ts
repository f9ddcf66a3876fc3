import type { CheckStepAttrs, DocNode, FileAttrs, HazardNoteAttrs, ImageAttrs, ProcedureDoc, ReadingAttrs, ReckonerAttrs } from './schema';
import { walk } from './schema';

/** The structured blocks of a document, in document order, each with the heading it sits under. */
export interface DocBlocks {
  reckoners: (ReckonerAttrs & { section: string })[];
  readings: (ReadingAttrs & { section: string })[];
  checkSteps: (CheckStepAttrs & { section: string })[];
  hazardNotes: (HazardNoteAttrs & { section: string; text: string })[];
  images: ImageAttrs[];
  files: FileAttrs[];
}

export function textOf(node: DocNode): string {
  if (node.type === 'text') return node.text ?? '';
  if (node.type === 'hardBreak') return '\n';
  return (node.content ?? []).map(textOf).join('');
}

export function extractBlocks(doc: ProcedureDoc): DocBlocks {
  const out: DocBlocks = { reckoners: [], readings: [], checkSteps: [], hazardNotes: [], images: [], files: [] };
  let section = '';
  // Only top-level headings start sections; nested walking still finds blocks inside lists.
  for (const top of doc.content) {
    if (top.type === 'heading') section = textOf(top);
    walk(top, (node) => {
      const a = node.attrs as never;
      switch (node.type) {
        case 'reckoner':
          out.reckoners.push({ ...(a as ReckonerAttrs), section });
          break;
        case 'reading':
          out.readings.push({ ...(a as ReadingAttrs), section });
          break;
        case 'checkStep':
          out.checkSteps.push({ ...(a as CheckStepAttrs), section });
          break;
        case 'hazardNote':
          out.hazardNotes.push({ ...(a as HazardNoteAttrs), section, text: textOf(node) });
          break;
        case 'image':
          out.images.push(a as ImageAttrs);
          break;
        case 'file':
          out.files.push(a as FileAttrs);
          break;
      }
    });
  }
  return out;
}

/** Plain text of the whole document for search and diffs: one line per block. */
export function plainText(doc: ProcedureDoc): string {
  const lines: string[] = [];
  const visit = (node: DocNode) => {
    const a = (node.attrs ?? {}) as Record<string, unknown>;
    switch (node.type) {
      case 'paragraph':
      case 'heading':
      case 'codeBlock':
        lines.push(textOf(node));
        return;
      case 'reading':
        lines.push(`Reading: ${a.label} at ${a.testPoint} (${a.meterRange}), tolerance ${a.tolerance}`);
        return;
      case 'checkStep':
        lines.push(`Check: ${a.text}`);
        return;
      case 'image':
        lines.push(`Image: ${a.caption || a.alt}`);
        return;
      case 'file':
        lines.push(`File: ${a.fileName}`);
        return;
      case 'reckoner':
        return; // summarised from the snapshot by whoever needs it
      default:
        node.content?.forEach(visit);
    }
  };
  visit(doc);
  return lines.filter((l) => l.trim()).join('\n');
}
