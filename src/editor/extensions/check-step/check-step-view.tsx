import { useId } from 'react';
import type { NodeViewProps } from '@tiptap/react';
import type { CheckStepAttrs } from '@shared/document/schema';
import { BlockFrame } from '../block-frame';

export function CheckStepView({ node, updateAttributes, deleteNode, selected }: NodeViewProps) {
  const attrs = node.attrs as CheckStepAttrs;
  const id = useId();
  return (
    <BlockFrame blockId={attrs.id} selected={selected} onRemove={deleteNode} title="Check step">
      <div className="flex items-start gap-3">
        {/* What the technician will see: a box to tick. Not tickable while writing. */}
        <span aria-hidden className="mt-2 inline-block size-5 shrink-0 rounded border-2 border-graphite" />
        <div className="flex flex-1 flex-col gap-1">
          <label htmlFor={id} className="text-xs font-semibold">
            The technician confirms
          </label>
          <textarea
            id={id}
            rows={2}
            maxLength={500}
            className="rounded border border-rule bg-card px-2 py-1 text-sm"
            value={attrs.text}
            placeholder="Reservoir and filter capacitors discharged and verified below 10 V with the meter."
            onChange={(e) => updateAttributes({ text: e.target.value })}
          />
          {!attrs.text.trim() && <p className="text-xs text-out">A check step needs the text to confirm.</p>}
        </div>
      </div>
    </BlockFrame>
  );
}
