import type { ReactNode } from 'react';
import type { BlockView } from '@shared/document/block-view';
import type { Snapshot } from '@shared/document/evaluate';
import { checkStepHeading } from '@shared/document/extract';
import {
  checkKindOf,
  HAZARD_FLAG_LABELS,
  HAZARD_FLAGS,
  isLiveReading,
  type CheckStepAttrs,
  type DocNode,
  type FileAttrs,
  type HazardNoteAttrs,
  type ImageAttrs,
  type ProcedureDoc,
  type ReadingAttrs,
  type ReckonerAttrs,
} from '@shared/document/schema';
import { attachmentUrl } from '../../api/upload-attachment';
import { HazardBox } from './hazard-box';
import { ReadingsTable } from './readings-table';
import { ReckonerCard } from './reckoner-card';
import { renderText } from './render-marks';

interface Stored {
  snapshot: Snapshot;
  /** Reckoner blocks by id, as described by the server. */
  reckoners: Map<string, BlockView>;
}

/** Runs of readings become one table and runs of check steps one checklist. */
function renderChildren(nodes: DocNode[] | undefined, stored: Stored): ReactNode[] {
  const { snapshot } = stored;
  const out: ReactNode[] = [];
  const list = nodes ?? [];
  for (let i = 0; i < list.length; i++) {
    const node = list[i]!;
    if (node.type === 'reading' || node.type === 'checkStep') {
      let j = i;
      while (j + 1 < list.length && list[j + 1]!.type === node.type) j++;
      const run = list.slice(i, j + 1);
      out.push(
        node.type === 'reading' ? (
          <ReadingsTable
            key={i}
            readings={run.map((n) => snapshot.readings.find((r) => r.id === n.attrs?.id)).filter((r) => !!r)}
            live={
              new Set(
                run.filter((n) => isLiveReading(n.attrs as ReadingAttrs)).map((n) => String(n.attrs?.id)),
              )
            }
          />
        ) : (
          <Checklist key={i} steps={run.map((n) => n.attrs as CheckStepAttrs)} />
        ),
      );
      i = j;
      continue;
    }
    out.push(renderNode(node, i, stored));
  }
  return out;
}

function Checklist({ steps }: { steps: CheckStepAttrs[] }) {
  return (
    <ul className="not-prose my-4 flex flex-col gap-2" aria-label="Checks">
      {steps.map((s) => (
        <li key={s.id}>
          <label className="flex min-h-11 items-start gap-3 rounded border border-rule bg-card px-3 py-2">
            <input type="checkbox" className="mt-1 size-5 shrink-0" />
            <span>
              {(checkKindOf(s) !== 'confirm' || s.live) && (
                <strong className="block text-sm">{checkStepHeading(s)}</strong>
              )}
              {s.text}
            </span>
          </label>
        </li>
      ))}
    </ul>
  );
}

function renderNode(node: DocNode, key: number, stored: Stored): ReactNode {
  const kids = () => renderChildren(node.content, stored);
  const a = (node.attrs ?? {}) as Record<string, unknown>;
  switch (node.type) {
    case 'text':
      return renderText(node, key);
    case 'paragraph':
      return <p key={key}>{kids()}</p>;
    case 'heading': {
      // The page title is the h1, so document headings sit one level lower.
      const Tag = `h${Math.min(6, Number(a.level ?? 2) + 1)}` as 'h2';
      return <Tag key={key}>{kids()}</Tag>;
    }
    case 'bulletList':
      return <ul key={key}>{kids()}</ul>;
    case 'orderedList':
      return (
        <ol key={key} start={Number(a.start ?? 1)}>
          {kids()}
        </ol>
      );
    case 'listItem':
      return <li key={key}>{kids()}</li>;
    case 'blockquote':
      return <blockquote key={key}>{kids()}</blockquote>;
    case 'codeBlock':
      return (
        <pre key={key}>
          <code>{kids()}</code>
        </pre>
      );
    case 'horizontalRule':
      return <hr key={key} />;
    case 'hardBreak':
      return <br key={key} />;
    case 'reckoner': {
      const r = a as unknown as ReckonerAttrs;
      return <ReckonerCard key={key} name={r.name} view={stored.reckoners.get(r.id)} />;
    }
    case 'hazardNote':
      return (
        <HazardBox
          key={key}
          level={a.level === 'warning' ? 'warning' : 'danger'}
          flags={HAZARD_FLAGS.filter((f) => (a as HazardNoteAttrs).flags?.[f]).map(
            (f) => HAZARD_FLAG_LABELS[f],
          )}
        >
          {kids()}
        </HazardBox>
      );
    case 'image': {
      const img = a as unknown as ImageAttrs;
      return (
        <figure key={key}>
          <img
            src={attachmentUrl(img.attachmentId)}
            alt={img.alt}
            className="max-w-full rounded border border-rule"
          />
          {img.caption && <figcaption>{img.caption}</figcaption>}
        </figure>
      );
    }
    case 'file': {
      const f = a as unknown as FileAttrs;
      return (
        <p key={key}>
          <a href={attachmentUrl(f.attachmentId)}>{f.fileName}</a>{' '}
          <span className="text-sm text-graphite-soft">
            ({f.mediaType === 'application/pdf' ? 'PDF' : 'image'})
          </span>
        </p>
      );
    }
    default:
      return null;
  }
}

/** A stored revision's document as plain React: no editor code is loaded to read a procedure. */
export function DocumentView({
  doc,
  snapshot,
  reckoners,
}: {
  doc: ProcedureDoc;
  snapshot: Snapshot;
  reckoners: BlockView[];
}) {
  const stored = { snapshot, reckoners: new Map(reckoners.map((b) => [b.id, b])) };
  return (
    <div className="procedure-text prose prose-stone max-w-none font-serif">
      {renderChildren(doc.content, stored)}
    </div>
  );
}
