import type { NodeViewProps } from '@tiptap/react';
import type { FileAttrs } from '@shared/document/schema';
import { attachmentUrl } from '@/features/procedures/api/upload-attachment';
import { BlockFrame } from '../block-frame';
import { UploadButton } from '../upload-button';

export const MEDIA_TYPE_LABELS: Record<FileAttrs['mediaType'], string> = {
  'application/pdf': 'PDF',
  'image/png': 'PNG image',
  'image/jpeg': 'JPEG image',
  'image/webp': 'WebP image',
};

export function FileView({ node, updateAttributes, deleteNode, selected }: NodeViewProps) {
  const attrs = node.attrs as FileAttrs;
  return (
    <BlockFrame
      blockId={attrs.id}
      selected={selected}
      onRemove={deleteNode}
      title="File"
      headerExtra={
        <UploadButton
          label="Replace file"
          accept="application/pdf,image/png,image/jpeg,image/webp"
          onUploaded={(a) =>
            updateAttributes({ attachmentId: a.id, fileName: a.fileName, mediaType: a.mediaType })
          }
        />
      }
    >
      <a
        href={attachmentUrl(attrs.attachmentId)}
        className="text-accent underline"
        target="_blank"
        rel="noopener"
      >
        {attrs.fileName}
      </a>{' '}
      <span className="text-xs text-graphite-soft">
        ({MEDIA_TYPE_LABELS[attrs.mediaType] ?? attrs.mediaType})
      </span>
    </BlockFrame>
  );
}
