import { useImperativeHandle, useMemo, useRef, useState, type Ref } from 'react';
import { EditorContent, useEditor } from '@tiptap/react';
import type { ProcedureDoc } from '@shared/document/schema';
import { upgradeDocument } from '@shared/document/upgrade';
import type { AttachmentView } from '@shared/schemas/procedures';
import { uploadAttachment } from '@/features/procedures/api/upload-attachment';
import { blockCatalog, type CatalogEntry } from './block-catalog';
import { EvaluationContext, type Evaluation } from './evaluation-context';
import { procedureExtensions } from './extensions';
import { focusBlock } from './focus-block';
import { InsertMenu } from './insert-menu';
import { Toolbar } from './toolbar';
import { UploadButton } from './extensions/upload-button';

export interface ProcedureEditorHandle {
  /** Scrolls to the block with this attrs.id and focuses its first control; false if it is gone. */
  focusBlock: (id: string) => boolean;
  /** Replaces the whole document (loading the server's version after a conflict). */
  setDocument: (doc: ProcedureDoc) => void;
}

interface Props {
  initialDoc: ProcedureDoc;
  evaluation: Evaluation;
  onChange: (doc: ProcedureDoc) => void;
  ref?: Ref<ProcedureEditorHandle>;
}

/** The procedure editor: text, structured blocks with live results, an Insert block list. */
export function ProcedureEditor({ initialDoc, evaluation, onChange, ref }: Props) {
  const [menu, setMenu] = useState<{ query: string; anchor: { top: number; left: number } | null } | null>(
    null,
  );
  const [uploadError, setUploadError] = useState<string | null>(null);
  const filePicker = useRef<HTMLInputElement>(null);
  const pendingUpload = useRef<'image' | 'file'>('image');
  const openMenuRef = useRef<(query?: string) => void>(() => {});
  const onChangeRef = useRef(onChange);
  onChangeRef.current = onChange;

  const editor = useEditor({
    extensions: procedureExtensions(() => openMenuRef.current()),
    // Documents saved before fields declared what they follow open upgraded (shared/document/upgrade.ts).
    content: upgradeDocument(initialDoc),
    injectCSS: false,
    shouldRerenderOnTransaction: false,
    editorProps: {
      attributes: {
        class: 'procedure-text prose prose-stone max-w-none min-h-96 px-4 py-4 focus:outline-none',
        'aria-label': 'Procedure text',
        'aria-multiline': 'true',
        role: 'textbox',
      },
    },
    onUpdate: ({ editor: e }) => onChangeRef.current(e.getJSON() as ProcedureDoc),
  });

  openMenuRef.current = (query = '') => {
    if (!editor) return;
    let anchor: { top: number; left: number } | null;
    try {
      const c = editor.view.coordsAtPos(editor.state.selection.from);
      anchor = { top: c.bottom, left: c.left };
    } catch {
      anchor = null;
    }
    setMenu({ query, anchor });
  };

  useImperativeHandle(
    ref,
    () => ({
      focusBlock: (id) => (editor ? focusBlock(editor, id) : false),
      setDocument: (doc) => editor?.commands.setContent(doc, { emitUpdate: true }),
    }),
    [editor],
  );

  const insertUploaded = (kind: 'image' | 'file', a: AttachmentView) => {
    if (!editor) return;
    setUploadError(null);
    if (kind === 'image')
      editor.chain().focus().insertImage({ attachmentId: a.id, alt: a.fileName, caption: '' }).run();
    else
      editor
        .chain()
        .focus()
        .insertFile({ attachmentId: a.id, fileName: a.fileName, mediaType: a.mediaType })
        .run();
  };

  const choose = (entry: CatalogEntry) => {
    setMenu(null);
    if (!editor) return;
    if (entry.insert) entry.insert(editor);
    else if (entry.upload) {
      pendingUpload.current = entry.upload;
      if (filePicker.current) {
        filePicker.current.accept =
          entry.upload === 'image'
            ? 'image/png,image/jpeg,image/webp'
            : 'application/pdf,image/png,image/jpeg,image/webp';
        filePicker.current.click();
      }
    }
  };

  const entries = useMemo(() => blockCatalog(), []);
  // The toolbar's block buttons run the same catalog entries as the Insert block list, so the caret
  // lands in the new block's text either way.
  const insertEntry = (key: string) => {
    const entry = entries.find((e) => e.key === key);
    if (entry) choose(entry);
  };
  if (!editor) return null;

  return (
    <EvaluationContext.Provider value={evaluation}>
      <div
        className="procedure-editor rounded-lg border border-rule bg-card"
        onKeyDown={(e) => {
          if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === 'k') {
            e.preventDefault();
            openMenuRef.current();
          }
        }}
      >
        <Toolbar
          editor={editor}
          onOpenMenu={(q) => openMenuRef.current(q)}
          onInsertReading={() => insertEntry('reading')}
          onInsertCheck={() => insertEntry('check')}
          onInsertHazard={() => insertEntry('hazard')}
          upload={
            <>
              <UploadButton
                label="Image…"
                accept="image/png,image/jpeg,image/webp"
                className="min-h-10 rounded border border-rule bg-card px-3 text-sm hover:bg-paper-deep"
                onUploaded={(a) => insertUploaded('image', a)}
              />
              <UploadButton
                label="File…"
                accept="application/pdf,image/png,image/jpeg,image/webp"
                className="min-h-10 rounded border border-rule bg-card px-3 text-sm hover:bg-paper-deep"
                onUploaded={(a) => insertUploaded('file', a)}
              />
            </>
          }
        />
        <input
          ref={filePicker}
          type="file"
          className="sr-only"
          tabIndex={-1}
          aria-hidden
          onChange={async (e) => {
            const file = e.target.files?.[0];
            e.target.value = '';
            if (!file) return;
            try {
              insertUploaded(pendingUpload.current, await uploadAttachment(file));
            } catch (err) {
              setUploadError(err instanceof Error ? err.message : String(err));
            }
          }}
        />
        {uploadError && (
          <p role="alert" className="border-b border-out bg-out-wash px-4 py-2 text-sm text-out">
            {uploadError} Nothing else in the draft changed.
          </p>
        )}
        <EditorContent editor={editor} />
        <p className="no-print border-t border-rule px-4 py-2 text-xs text-graphite-soft">
          Type <kbd className="value">/</kbd> on an empty line or press <kbd className="value">Ctrl K</kbd> to
          insert a block. <kbd className="value">Ctrl S</kbd> saves.
        </p>
      </div>
      {menu && (
        <InsertMenu
          entries={entries}
          anchor={menu.anchor}
          onChoose={choose}
          onClose={() => {
            setMenu(null);
            editor.commands.focus();
          }}
        />
      )}
    </EvaluationContext.Provider>
  );
}
