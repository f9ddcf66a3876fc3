import { NodeViewContent, NodeViewWrapper, type NodeViewProps } from '@tiptap/react';
import type { HazardNoteAttrs } from '@shared/document/schema';
import { HazardTriangle } from '@/features/procedures/components/hazard-triangle';

export function HazardNoteView({ node, updateAttributes, deleteNode }: NodeViewProps) {
  const attrs = node.attrs as HazardNoteAttrs;
  return (
    <NodeViewWrapper data-block-id={attrs.id} className="hazard-note not-prose my-4 flex gap-3 rounded-md border-4 border-hazard-ink bg-hazard p-3 text-hazard-ink">
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
          <button type="button" className="ml-auto min-h-9 rounded border-2 border-hazard-ink px-2 text-xs font-semibold" onClick={deleteNode}>
            Remove block
          </button>
        </div>
        <NodeViewContent className="hazard-note-text font-semibold" />
      </div>
    </NodeViewWrapper>
  );
}
