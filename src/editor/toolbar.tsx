import { useEditorState, type Editor } from '@tiptap/react';
import type { ReactNode } from 'react';
import { WarningTriangle } from '@/components/ui/safety-sign';

interface Props {
  editor: Editor;
  onOpenMenu: (query?: string) => void;
  onInsertReading: () => void;
  onInsertCheck: () => void;
  onInsertHazard: () => void;
  upload: ReactNode;
}

const button =
  'min-h-10 rounded border border-rule bg-card px-3 text-sm hover:bg-paper-deep aria-pressed:bg-accent aria-pressed:text-white';

/** Formatting and block buttons above the text; every one is also reachable from the Insert block list. */
export function Toolbar({
  editor,
  onOpenMenu,
  onInsertReading,
  onInsertCheck,
  onInsertHazard,
  upload,
}: Props) {
  const active = useEditorState({
    editor,
    selector: ({ editor: e }) => ({
      bold: e.isActive('bold'),
      italic: e.isActive('italic'),
      heading: e.isActive('heading', { level: 2 }),
      bullets: e.isActive('bulletList'),
      numbers: e.isActive('orderedList'),
    }),
  });
  const chain = () => editor.chain().focus();
  return (
    <div
      role="toolbar"
      aria-label="Procedure text"
      className="no-print sticky top-0 z-20 flex flex-wrap items-center gap-1 border-b border-rule bg-paper-deep px-2 py-2"
    >
      <button
        type="button"
        className={`${button} font-bold`}
        aria-pressed={active.bold}
        onClick={() => chain().toggleBold().run()}
      >
        Bold
      </button>
      <button
        type="button"
        className={`${button} italic`}
        aria-pressed={active.italic}
        onClick={() => chain().toggleItalic().run()}
      >
        Italic
      </button>
      <button
        type="button"
        className={button}
        aria-pressed={active.heading}
        onClick={() => chain().toggleHeading({ level: 2 }).run()}
      >
        Section heading
      </button>
      <button
        type="button"
        className={button}
        aria-pressed={active.bullets}
        onClick={() => chain().toggleBulletList().run()}
      >
        Bullets
      </button>
      <button
        type="button"
        className={button}
        aria-pressed={active.numbers}
        onClick={() => chain().toggleOrderedList().run()}
      >
        Numbered
      </button>
      <span className="mx-1 h-8 w-px bg-rule" aria-hidden />
      <button type="button" className={button} onClick={() => onOpenMenu('reckoner')}>
        Reckoner…
      </button>
      <button type="button" className={button} onClick={onInsertReading}>
        Reading
      </button>
      <button type="button" className={button} onClick={onInsertCheck}>
        Check step
      </button>
      <button type="button" className={`${button} inline-flex items-center gap-1.5`} onClick={onInsertHazard}>
        <WarningTriangle className="size-5" />
        Hazard note
      </button>
      {upload}
      <button
        type="button"
        className={`${button} ml-auto font-semibold`}
        onClick={() => onOpenMenu()}
        aria-keyshortcuts="Control+K"
      >
        Insert block <kbd className="value text-xs">Ctrl K</kbd>
      </button>
    </div>
  );
}
