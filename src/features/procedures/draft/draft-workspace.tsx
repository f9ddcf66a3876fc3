import { useDeferredValue, useEffect, useMemo, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { evaluateDocument } from '@shared/document/evaluate';
import { lintProcedure } from '@shared/document/lint';
import type { ProcedureParams } from '@shared/document/params';
import type { ProcedureDoc } from '@shared/document/schema';
import type { RevisionView } from '@shared/schemas/procedures';
import { RegionBoundary } from '@/components/errors/region-boundary';
import { Button } from '@/components/ui/button';
import { paths } from '@/config/paths';
import { DraftDetails } from '@/features/procedures/components/draft-details';
import { ProcedureCheckPanel } from '@/features/procedures/components/procedure-check-panel';
import { ConflictPanel } from './conflict-panel';
import { draftFromRevision, sameDraft, type DraftFields } from './draft-fields';
import { LeaveGuard } from './leave-guard';
import { dropLocalCopy, findLocalCopy, type LocalCopy } from './local-copy';
import { SaveProblems } from './save-problems';
import { SaveStatus } from './save-status';
import { useDraftSave } from './use-draft-save';
import { ProcedureEditor, type ProcedureEditorHandle } from '@/editor/editor';
import type { Evaluation } from '@/editor/evaluation-context';

function evaluate(doc: ProcedureDoc, params: ProcedureParams): Evaluation {
  try {
    return { snapshot: evaluateDocument(doc, params), params, failure: null };
  } catch (e) {
    return { snapshot: null, params, failure: e instanceof Error ? e.message : String(e) };
  }
}

/** Editing one draft revision: details, the editor with live results, the procedure check and saving. */
export function DraftWorkspace({ revision }: { revision: RevisionView }) {
  const [draft, setDraft] = useState<DraftFields>(() => draftFromRevision(revision));
  const [detailsKey, setDetailsKey] = useState(0);
  const [localCopy, setLocalCopy] = useState<LocalCopy | null>(() => {
    const copy = findLocalCopy(revision.id);
    if (copy && sameDraft(copy.draft, draftFromRevision(revision))) {
      dropLocalCopy(revision.id);
      return null;
    }
    return copy;
  });
  const saver = useDraftSave(revision, draft);
  const editor = useRef<ProcedureEditorHandle>(null);

  // One evaluation for the whole document, shared by every block, deferred so typing stays smooth.
  const doc = useDeferredValue(draft.document);
  const evaluation = useMemo(() => evaluate(doc, draft.params), [doc, draft.params]);
  const warnings = useMemo(
    () => (evaluation.snapshot ? lintProcedure(doc, evaluation.snapshot) : []),
    [doc, evaluation],
  );

  const update = (next: DraftFields) => {
    setDraft(next);
    saver.changed(next);
  };
  const replaceAll = (next: DraftFields) => {
    setDraft(next);
    editor.current?.setDocument(next.document);
    setDetailsKey((k) => k + 1);
  };

  const { save } = saver;
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === 's') {
        e.preventDefault();
        void save();
      }
    };
    window.addEventListener('keydown', onKey, true);
    return () => window.removeEventListener('keydown', onKey, true);
  }, [save]);

  const state = saver.state;
  return (
    <div className="flex flex-col gap-4">
      <header className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h1 className="text-2xl font-semibold">{draft.title || 'Untitled procedure'}</h1>
        <span className="text-sm text-graphite-soft">
          Revision <span className="value">{revision.number}</span>, draft
        </span>
        <Link to={paths.revision.href(revision.id)} className="text-sm text-accent underline">
          Read the last saved version
        </Link>
      </header>

      {localCopy && (
        <div
          role="alert"
          className="flex flex-wrap items-center gap-3 rounded-md border border-accent bg-accent-wash px-4 py-3 text-sm"
        >
          <span>
            This device kept unsaved work on this draft from {new Date(localCopy.keptAt).toLocaleString()}.
          </span>
          <Button
            onClick={() => {
              replaceAll(localCopy.draft);
              saver.adopt(
                { lockVersion: localCopy.lockVersion, updatedAt: localCopy.keptAt },
                localCopy.draft,
              );
              setLocalCopy(null);
            }}
          >
            Restore it
          </Button>
          <Button
            variant="quiet"
            onClick={() => {
              dropLocalCopy(revision.id);
              setLocalCopy(null);
            }}
          >
            Discard it
          </Button>
        </div>
      )}

      {state.kind === 'conflict' && (
        <ConflictPanel
          message={state.message}
          mine={draft}
          current={state.current}
          editable={state.editable}
          onKeepMine={saver.keepMine}
          onLoadTheirs={() => {
            replaceAll(draftFromRevision(state.current));
            saver.adopt(state.current);
          }}
        />
      )}
      {state.kind === 'refused' && (
        <SaveProblems message={state.message} problems={state.problems} doc={draft.document} />
      )}

      <div className="grid grid-cols-1 items-start gap-4 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <div className="flex min-w-0 flex-col gap-4">
          <DraftDetails
            key={detailsKey}
            value={draft}
            problems={state.kind === 'refused' ? state.problems : []}
            onChange={(details) => update({ ...details, document: draft.document })}
          />
          <ProcedureEditor
            ref={editor}
            initialDoc={revision.document}
            evaluation={evaluation}
            onChange={(document) => {
              // Selection-only and normalising transactions can report an unchanged document.
              if (JSON.stringify(document) !== JSON.stringify(draft.document)) update({ ...draft, document });
            }}
          />
        </div>
        <aside className="flex flex-col gap-3 lg:sticky lg:top-4" aria-label="Saving and procedure check">
          <div className="flex flex-col gap-2 rounded-lg border border-rule bg-card p-3">
            <SaveStatus state={state} />
            <Button
              onClick={() => void saver.save()}
              disabled={state.kind === 'saving' || state.kind === 'conflict'}
              whyDisabled={
                state.kind === 'conflict'
                  ? 'First choose above: keep yours or load the saved one.'
                  : 'Saving…'
              }
              aria-keyshortcuts="Control+S"
            >
              Save draft
            </Button>
          </div>
          <RegionBoundary label="Procedure check">
            <ProcedureCheckPanel warnings={warnings} onSelect={(id) => editor.current?.focusBlock(id)} />
          </RegionBoundary>
        </aside>
      </div>
      <LeaveGuard unsaved={state.kind !== 'saved'} onSave={saver.save} />
    </div>
  );
}
