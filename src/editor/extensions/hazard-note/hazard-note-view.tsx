import { NodeViewContent, NodeViewWrapper, type NodeViewProps } from '@tiptap/react';
import { useId } from 'react';
import {
  HAZARD_FLAG_LABELS,
  HAZARD_FLAGS,
  type HazardFlag,
  type HazardNoteAttrs,
} from '@shared/document/schema';
import { HazardTriangle } from '@/features/procedures/components/hazard-triangle';

export function HazardNoteView({ node, updateAttributes, deleteNode }: NodeViewProps) {
  const attrs = node.attrs as HazardNoteAttrs;
  const groupId = useId();
  // Only ticked flags are kept; none ticked is stored as "not stated".
  const setFlag = (flag: HazardFlag, on: boolean) => {
    const next = HAZARD_FLAGS.filter((f) => (f === flag ? on : attrs.flags?.[f]));
    updateAttributes({ flags: next.length ? Object.fromEntries(next.map((f) => [f, true])) : null });
  };
  return (
    <NodeViewWrapper
      data-block-id={attrs.id}
      className="hazard-note not-prose my-4 flex gap-3 rounded-md border-4 border-hazard-ink bg-hazard p-3 text-hazard-ink"
    >
      <HazardTriangle className="size-10 shrink-0" />
      <div className="flex flex-1 flex-col gap-1">
        <div className="flex items-center gap-2" contentEditable={false}>
          <select
            aria-label="Hazard level"
            className="min-h-9 rounded border-2 border-hazard-ink bg-hazard px-2 text-sm font-bold uppercase"
            value={attrs.level}
            onChange={(e) => updateAttributes({ level: e.target.value })}
          >
            <option value="danger">Danger</option>
            <option value="warning">Warning</option>
          </select>
          <button
            type="button"
            className="ml-auto min-h-9 rounded border-2 border-hazard-ink px-2 text-xs font-semibold"
            onClick={deleteNode}
          >
            Remove block
          </button>
        </div>
        <fieldset
          className="flex flex-wrap gap-x-4 gap-y-1 text-sm"
          contentEditable={false}
          aria-describedby={`${groupId}-help`}
        >
          <legend className="sr-only">Live-work cautions this note states</legend>
          <span id={`${groupId}-help`} className="w-full text-xs font-semibold">
            This note states (the procedure check relies on these, not on the wording; current-limited covers
            a series lamp, a limiter or a variable supply):
          </span>
          {HAZARD_FLAGS.map((f) => (
            <label key={f} className="flex min-h-9 items-center gap-2">
              <input
                type="checkbox"
                className="size-5 accent-hazard-ink"
                checked={attrs.flags?.[f] === true}
                onChange={(e) => setFlag(f, e.target.checked)}
              />
              {HAZARD_FLAG_LABELS[f]}
            </label>
          ))}
        </fieldset>
        <NodeViewContent className="hazard-note-text font-semibold" />
      </div>
    </NodeViewWrapper>
  );
}
