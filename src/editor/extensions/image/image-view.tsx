import { useId } from 'react';
import type { NodeViewProps } from '@tiptap/react';
import type { ImageAttrs } from '@shared/document/schema';
import { attachmentUrl } from '@/features/procedures/api/upload-attachment';
import { BlockFrame } from '../block-frame';
import { UploadButton } from '../upload-button';

export function ImageView({ node, updateAttributes, deleteNode, selected }: NodeViewProps) {
  const attrs = node.attrs as ImageAttrs;
  const ids = { alt: useId(), caption: useId() };
  return (
    <BlockFrame
      blockId={attrs.id}
      selected={selected}
      onRemove={deleteNode}
      title="Image"
      headerExtra={
        <UploadButton
          label="Replace image"
          accept="image/png,image/jpeg,image/webp"
          onUploaded={(a) => updateAttributes({ attachmentId: a.id })}
        />
      }
    >
      <figure className="flex flex-col gap-2">
        <img
          src={attachmentUrl(attrs.attachmentId)}
          alt={attrs.alt}
          className="max-h-96 max-w-full self-start rounded border border-rule"
        />
        <div className="grid grid-cols-1 gap-2 sm:grid-cols-2">
          <div className="flex flex-col gap-1">
            <label htmlFor={ids.alt} className="text-xs font-semibold">
              Describe the image (for screen readers)
            </label>
            <input
              id={ids.alt}
              maxLength={300}
              className="min-h-9 rounded border border-rule bg-card px-2 text-sm"
              value={attrs.alt}
              onChange={(e) => updateAttributes({ alt: e.target.value })}
            />
          </div>
          <div className="flex flex-col gap-1">
            <label htmlFor={ids.caption} className="text-xs font-semibold">
              Caption
            </label>
            <input
              id={ids.caption}
              maxLength={300}
              className="min-h-9 rounded border border-rule bg-card px-2 text-sm"
              value={attrs.caption}
              onChange={(e) => updateAttributes({ caption: e.target.value })}
            />
          </div>
        </div>
      </figure>
    </BlockFrame>
  );
}
