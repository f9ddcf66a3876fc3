import { StarterKit } from '@tiptap/starter-kit';
import { CheckStep } from './check-step';
import { FileBlock } from './file';
import { HazardNote } from './hazard-note';
import { ImageBlock } from './image';
import { InsertTrigger } from './insert-trigger';
import { Reading } from './reading';
import { Reckoner } from './reckoner';
import { SafeLink } from './safe-link';
import { UniqueBlockIds } from './unique-ids';

/**
 * The editor's extensions: exactly the node and mark set of shared/document/schema.ts.
 * StarterKit's link is replaced (no title attribute, http/https/mailto only).
 */
export function procedureExtensions(onOpenMenu: () => void) {
  return [
    // No trailing-node: it edits the document on open, which would mark an untouched draft changed.
    StarterKit.configure({ heading: { levels: [1, 2, 3, 4] }, link: false, trailingNode: false }),
    SafeLink,
    Reckoner,
    Reading,
    CheckStep,
    HazardNote,
    ImageBlock,
    FileBlock,
    UniqueBlockIds,
    InsertTrigger.configure({ onOpen: onOpenMenu }),
  ];
}
