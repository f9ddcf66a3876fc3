import { Extension } from '@tiptap/core';
import { Plugin, PluginKey } from '@tiptap/pm/state';

export interface InsertTriggerOptions {
  /** Called when the author asks for the block list. */
  onOpen: () => void;
}

/** "/" typed in an empty paragraph opens the Insert block list instead of inserting a slash. */
export const InsertTrigger = Extension.create<InsertTriggerOptions>({
  name: 'insertTrigger',
  addOptions() {
    return { onOpen: () => {} };
  },
  addProseMirrorPlugins() {
    return [
      new Plugin({
        key: new PluginKey('insertTrigger'),
        props: {
          handleTextInput: (view, _from, _to, text) => {
            const { $from, empty } = view.state.selection;
            if (
              text !== '/' ||
              !empty ||
              $from.parent.type.name !== 'paragraph' ||
              $from.parent.content.size > 0
            )
              return false;
            this.options.onOpen();
            return true;
          },
        },
      }),
    ];
  },
});
