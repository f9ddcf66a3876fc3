import type { ReactNode } from 'react';
import { NodeViewWrapper } from '@tiptap/react';

interface Props {
  blockId: string;
  /** What kind of block this is, shown as its small heading. */
  title: ReactNode;
  selected: boolean;
  onRemove: () => void;
  className?: string;
  headerExtra?: ReactNode;
  children: ReactNode;
}

/** The common frame of a structured block: a heading row with a remove button, then the block's form. */
export function BlockFrame({
  blockId,
  title,
  selected,
  onRemove,
  className = '',
  headerExtra,
  children,
}: Props) {
  return (
    <NodeViewWrapper
      data-block-id={blockId}
      className={`bw-block not-prose my-4 rounded-lg border p-3 ${selected ? 'ring-2 ring-accent' : ''} ${className || 'border-rule bg-card'}`}
    >
      <div className="mb-2 flex flex-wrap items-center gap-2" contentEditable={false}>
        <span
          data-drag-handle
          className="cursor-grab select-none text-xs font-semibold uppercase tracking-wide"
          aria-hidden="false"
        >
          {title}
        </span>
        {headerExtra}
        <button
          type="button"
          className="ml-auto min-h-9 rounded border border-rule bg-card px-2 text-xs hover:bg-out-wash"
          onClick={onRemove}
        >
          Remove block
        </button>
      </div>
      {children}
    </NodeViewWrapper>
  );
}
