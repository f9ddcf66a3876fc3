import type { ReactNode } from 'react';
import type { BlockView } from '@shared/document/block-view';
import type { Snapshot } from '@shared/document/evaluate';
import {
  checkStepHeading,
  hazardFlagList,
  isLiveReading,
  isNodeType,
  showsHeading,
  type AttrsOf,
  type CheckStepAttrs,
  type DocNode,
  type NodeType,
  type ProcedureDoc,
  type ReadingAttrs,
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

interface ViewProps<T extends NodeType> {
  a: AttrsOf<T>;
  node: DocNode;
  key: number;
  kids: () => ReactNode[];
  stored: Stored;
}

/** How the reader shows each node type of the document registry (the type checker asks for every one). */
const VIEWS: { [T in NodeType]: (p: ViewProps<T>) => ReactNode } = {
  doc: ({ kids }) => kids(),
  text: ({ node, key }) => renderText(node, key),
  paragraph: ({ key, kids }) => <p key={key}>{kids()}</p>,
  heading: ({ a, key, kids }) => {
    // The page title is the h1, so document headings sit one level lower.
    const Tag = `h${Math.min(6, a.level + 1)}` as 'h2';
    return <Tag key={key}>{kids()}</Tag>;
  },
  bulletList: ({ key, kids }) => <ul key={key}>{kids()}</ul>,
  orderedList: ({ a, key, kids }) => (
    <ol key={key} start={a.start}>
      {kids()}
    </ol>
  ),
  listItem: ({ key, kids }) => <li key={key}>{kids()}</li>,
  blockquote: ({ key, kids }) => <blockquote key={key}>{kids()}</blockquote>,
  codeBlock: ({ key, kids }) => (
    <pre key={key}>
      <code>{kids()}</code>
    </pre>
  ),
  horizontalRule: ({ key }) => <hr key={key} />,
  hardBreak: ({ key }) => <br key={key} />,
  reckoner: ({ a, key, stored }) => (
    <ReckonerCard
      key={key}
      name={a.name}
      view={stored.reckoners.get(a.id)}
      block={stored.snapshot.blocks.find((b) => b.id === a.id)}
      readings={stored.snapshot.readings}
    />
  ),
  hazardNote: ({ a, key, kids }) => (
    <HazardBox key={key} level={a.level} flags={hazardFlagList(a)}>
      {kids()}
    </HazardBox>
  ),
  image: ({ a, key }) => (
    <figure key={key}>
      <img
        src={attachmentUrl(a.attachmentId)}
        alt={a.alt}
        className="max-w-full rounded border border-rule"
      />
      {a.caption && <figcaption>{a.caption}</figcaption>}
    </figure>
  ),
  file: ({ a, key }) => (
    <p key={key}>
      <a href={attachmentUrl(a.attachmentId)}>{a.fileName}</a>{' '}
      <span className="text-sm text-graphite-soft">
        ({a.mediaType === 'application/pdf' ? 'PDF' : 'image'})
      </span>
    </p>
  ),
  // A lone reading or check step; runs of them are shown together (RUNS).
  reading: ({ key, node, stored }) => RUNS.reading([node], key, stored),
  checkStep: ({ key, node }) => RUNS.checkStep([node], key),
};

/** Runs of readings become one table and runs of check steps one checklist. */
type RunView = (run: DocNode[], key: number, stored: Stored) => ReactNode;
const RUNS = {
  reading: (run: DocNode[], key: number, { snapshot }: Stored) => {
    const attrs = run.map((n) => n.attrs as ReadingAttrs);
    return (
      <ReadingsTable
        key={key}
        readings={attrs.map((a) => snapshot.readings.find((r) => r.id === a.id)).filter((r) => !!r)}
        live={new Set(attrs.filter(isLiveReading).map((a) => a.id))}
        holdPoints={new Set(attrs.filter((a) => a.holdPoint).map((a) => a.id))}
      />
    );
  },
  checkStep: (run: DocNode[], key: number) => (
    <Checklist key={key} steps={run.map((n) => n.attrs as CheckStepAttrs)} />
  ),
} satisfies Partial<Record<NodeType, RunView>>;
const runOf = (type: string): RunView | undefined => (RUNS as Partial<Record<string, RunView>>)[type];

function renderChildren(nodes: DocNode[] | undefined, stored: Stored): ReactNode[] {
  const out: ReactNode[] = [];
  const list = nodes ?? [];
  for (let i = 0; i < list.length; i++) {
    const node = list[i]!;
    const run = runOf(node.type);
    if (run) {
      let j = i;
      while (j + 1 < list.length && list[j + 1]!.type === node.type) j++;
      out.push(run(list.slice(i, j + 1), i, stored));
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
              {showsHeading(s) && <strong className="block text-sm">{checkStepHeading(s)}</strong>}
              {s.text}
            </span>
          </label>
        </li>
      ))}
    </ul>
  );
}

function renderNode(node: DocNode, key: number, stored: Stored): ReactNode {
  if (!isNodeType(node.type)) return null;
  const view = VIEWS[node.type] as (p: ViewProps<NodeType>) => ReactNode;
  return view({
    a: (node.attrs ?? {}) as never,
    node,
    key,
    kids: () => renderChildren(node.content, stored),
    stored,
  });
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
