import type { Editor } from '@tiptap/core';
import { NodeSelection } from '@tiptap/pm/state';
import { listReckoners } from '@shared/reckoners';
import { DEFAULT_DISCHARGE_THRESHOLD } from './extensions/check-step/check-step';
import { focusBlock } from './focus-block';

export interface CatalogEntry {
  key: string;
  label: string;
  hint: string;
  /** Runs at the current selection; upload entries instead ask for a file first. */
  insert?: (editor: Editor) => boolean;
  upload?: 'image' | 'file';
}

/** A check step's command selects the new step; the caret then goes to its text, once its form is drawn. */
function intoStepText(editor: Editor, inserted: boolean): boolean {
  const sel = editor.state.selection;
  if (inserted && sel instanceof NodeSelection) {
    const id = String(sel.node.attrs.id);
    requestAnimationFrame(() => focusBlock(editor, id, 'textarea'));
  }
  return inserted;
}

/** Everything the "Insert block" list offers, in the order shown. */
export function blockCatalog(): CatalogEntry[] {
  return [
    ...listReckoners().map((r) => ({
      key: `reckoner:${r.kind}`,
      label: `Reckoner: ${r.label}`,
      hint: r.summary,
      insert: (e: Editor) => e.chain().focus().insertReckoner(r.kind).run(),
    })),
    {
      key: 'reading',
      label: 'Reading',
      hint: 'A measurement with its expected value and tolerance',
      insert: (e) => e.chain().focus().insertReading().run(),
    },
    {
      key: 'check',
      label: 'Check step',
      hint: 'Something the technician confirms by ticking',
      insert: (e) => intoStepText(e, e.chain().focus().insertCheckStep().run()),
    },
    {
      key: 'check:discharge',
      label: 'Discharge verified',
      hint: 'A check step: capacitors measured below the safe voltage before touching',
      insert: (e) =>
        intoStepText(
          e,
          e
            .chain()
            .focus()
            .insertCheckStep(
              'Capacitors discharged below 60 V, verified with a meter at every filter node before touching anything inside.',
              { kind: 'discharge-verified', threshold: DEFAULT_DISCHARGE_THRESHOLD },
            )
            .run(),
        ),
    },
    {
      key: 'check:wait',
      label: 'Wait step',
      hint: 'A check step: wait a stated time, for the bleeder or the discharge probe',
      insert: (e) =>
        intoStepText(
          e,
          e
            .chain()
            .focus()
            .insertCheckStep('Switched off: wait for the bleeder before touching.', {
              kind: 'wait',
              seconds: 60,
            })
            .run(),
        ),
    },
    {
      key: 'hazard',
      label: 'Hazard note',
      hint: 'A caution in safety colours (danger or warning)',
      insert: (e) => e.chain().focus().insertHazardNote('danger').run(),
    },
    { key: 'image', label: 'Image…', hint: 'Upload a photo or drawing (PNG, JPEG, WebP)', upload: 'image' },
    { key: 'file', label: 'File…', hint: 'Upload a PDF or image to link to', upload: 'file' },
    {
      key: 'h2',
      label: 'Section heading',
      hint: 'Starts a section; hazard notes count per section',
      insert: (e) => e.chain().focus().setHeading({ level: 2 }).run(),
    },
    {
      key: 'h3',
      label: 'Sub-heading',
      hint: 'A smaller heading',
      insert: (e) => e.chain().focus().setHeading({ level: 3 }).run(),
    },
    {
      key: 'bullets',
      label: 'Bulleted list',
      hint: 'A list without numbers',
      insert: (e) => e.chain().focus().toggleBulletList().run(),
    },
    {
      key: 'numbers',
      label: 'Numbered list',
      hint: 'Steps in order',
      insert: (e) => e.chain().focus().toggleOrderedList().run(),
    },
    {
      key: 'rule',
      label: 'Divider',
      hint: 'A horizontal rule',
      insert: (e) => e.chain().focus().setHorizontalRule().run(),
    },
  ];
}

/** Entries matching every typed word, best first: label starts with the query, then label hits, then hint hits. */
export function filterCatalog(entries: CatalogEntry[], query: string): CatalogEntry[] {
  const q = query.trim().toLowerCase();
  const words = q.split(/\s+/).filter(Boolean);
  if (!words.length) return entries;
  const rank = (e: CatalogEntry) => {
    const label = e.label.toLowerCase().replace(/…$/, '');
    if (label === q) return 0;
    if (label.startsWith(q)) return 1;
    if (words.every((w) => label.includes(w))) return 2;
    return 3;
  };
  return entries
    .filter((e) => words.every((w) => `${e.label} ${e.hint} ${e.key}`.toLowerCase().includes(w)))
    .map((e, i) => ({ e, i, r: rank(e) }))
    .sort((a, b) => a.r - b.r || a.i - b.i)
    .map((x) => x.e);
}
