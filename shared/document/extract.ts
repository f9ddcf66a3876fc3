import type {
  CheckStepAttrs,
  DocNode,
  FileAttrs,
  HazardNoteAttrs,
  ImageAttrs,
  ProcedureDoc,
  ReadingAttrs,
  ReckonerAttrs,
} from './schema';
import { checkKindOf, HAZARD_FLAG_LABELS, HAZARD_FLAGS, walk } from './schema';

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

/** The flags a hazard note carries, in words ("Work one hand only; Isolation transformer"), '' for none. */
export function hazardFlagWords(a: HazardNoteAttrs): string {
  return HAZARD_FLAGS.filter((f) => a.flags?.[f])
    .map((f) => HAZARD_FLAG_LABELS[f])
    .join('; ');
}

/** Where a block sits: the heading it is under ('' before the first) and its place in document order. */
export interface Placed {
  section: string;
  order: number;
}

/** The structured blocks of a document, in document order, each with the heading it sits under. */
export interface DocBlocks {
  reckoners: (ReckonerAttrs & Placed)[];
  readings: (ReadingAttrs & Placed)[];
  checkSteps: (CheckStepAttrs & Placed)[];
  hazardNotes: (HazardNoteAttrs & Placed & { text: string })[];
  images: ImageAttrs[];
  files: FileAttrs[];
}

export function textOf(node: DocNode): string {
  if (node.type === 'text') return node.text ?? '';
  if (node.type === 'hardBreak') return '\n';
  return (node.content ?? []).map(textOf).join('');
}

export function extractBlocks(doc: ProcedureDoc): DocBlocks {
  const out: DocBlocks = {
    reckoners: [],
    readings: [],
    checkSteps: [],
    hazardNotes: [],
    images: [],
    files: [],
  };
  let section = '';
  let order = 0;
  // Only top-level headings start sections; nested walking still finds blocks inside lists.
  for (const top of doc.content) {
    if (top.type === 'heading') section = textOf(top);
    walk(top, (node) => {
      const a = node.attrs as never;
      const at = { section, order: order++ };
      switch (node.type) {
        case 'reckoner':
          out.reckoners.push({ ...(a as ReckonerAttrs), ...at });
          break;
        case 'reading':
          out.readings.push({ ...(a as ReadingAttrs), ...at });
          break;
        case 'checkStep':
          out.checkSteps.push({ ...(a as CheckStepAttrs), ...at });
          break;
        case 'hazardNote':
          out.hazardNotes.push({ ...(a as HazardNoteAttrs), ...at, text: textOf(node) });
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
        lines.push(
          `Reading${a.live === true ? ' (live)' : ''}: ${a.label} at ${a.testPoint} (${a.meterRange}), tolerance ${a.tolerance}`,
        );
        return;
      case 'checkStep':
        lines.push(`${checkStepHeading(a as CheckStepAttrs)}: ${a.text}`);
        return;
      case 'hazardNote': {
        // Only a note with flags gains a line, so text stored before flags existed reads the same.
        const flags = hazardFlagWords(a as HazardNoteAttrs);
        if (flags) lines.push(`Hazard note states: ${flags}`);
        node.content?.forEach(visit);
        return;
      }
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
