import { NodeViewContent, NodeViewWrapper, type NodeViewProps } from '@tiptap/react';
import { useId } from 'react';
import {
  HAZARD_FLAG_LABELS,
  HAZARD_FLAGS,
  type HazardFlag,
  type HazardNoteAttrs,
} from '@shared/document/schema';
import { SAFETY_SIGNS, SIGNAL_LEVELS, type SignalLevel } from '@shared/safety-signs';
import { WarningTriangle } from '@/components/ui/safety-sign';

export function HazardNoteView({ node, updateAttributes, deleteNode }: NodeViewProps) {
  const attrs = node.attrs as HazardNoteAttrs;
  const sign = SAFETY_SIGNS[attrs.level];
  const groupId = useId();
  // Only ticked flags are kept; none ticked is stored as "not stated".
  const setFlag = (flag: HazardFlag, on: boolean) => {
    const next = HAZARD_FLAGS.filter((f) => (f === flag ? on : attrs.flags?.[f]));
    updateAttributes({ flags: next.length ? Object.fromEntries(next.map((f) => [f, true])) : null });
  };
  return (
    <NodeViewWrapper
      data-block-id={attrs.id}
      className="hazard-note not-prose my-4 overflow-hidden rounded-md border-4 bg-card text-graphite"
      style={{ borderColor: sign.field }}
    >
      <div
        className="flex flex-wrap items-center gap-2 px-2 py-1"
        style={{ backgroundColor: sign.field, color: sign.ink }}
        contentEditable={false}
      >
        {sign.triangle && <WarningTriangle className="size-6" />}
        <select
          aria-label="Hazard level"
          className="min-h-9 max-w-full min-w-0 flex-1 rounded border-2 border-current bg-transparent px-2 text-sm font-bold tracking-wider sm:flex-none"
          value={attrs.level}
          onChange={(e) => updateAttributes({ level: e.target.value as SignalLevel })}
        >
          {SIGNAL_LEVELS.map((l) => (
            <option key={l} value={l} className="bg-card text-graphite">
              {SAFETY_SIGNS[l].word}: {SAFETY_SIGNS[l].meaning}
            </option>
          ))}
        </select>
        <button
          type="button"
          className="ml-auto min-h-9 rounded border-2 border-current px-2 text-xs font-semibold"
          onClick={deleteNode}
        >
          Remove block
        </button>
      </div>
      <div className="flex flex-col gap-1 p-3">
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
                className="size-5 accent-graphite"
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
