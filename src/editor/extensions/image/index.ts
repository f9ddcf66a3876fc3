import { ReactNodeViewRenderer } from '@tiptap/react';
import { ImageNode } from './image';
import { ImageView } from './image-view';

export const ImageBlock = ImageNode.extend({
  addNodeView() {
    return ReactNodeViewRenderer(ImageView);
  },
});
export default ImageBlock;
