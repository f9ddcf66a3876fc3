import { z } from 'zod';
import { SAFETY_SIGNS, SIGNAL_LEVELS } from '../../safety-signs';
import { added, blockId, defineNode, esc, textOf, yesNo } from './define';

/**
 * The live-work cautions a hazard note states, as flags the procedure check can rely on (the text
 * says them in words). Each absent flag means "not stated".
 */
export const HAZARD_FLAGS = ['oneHand', 'isolation', 'currentLimited', 'discharge'] as const;
export type HazardFlag = (typeof HAZARD_FLAGS)[number];
export const HAZARD_FLAG_LABELS: Record<HazardFlag, string> = {
  oneHand: 'Work one hand only',
  isolation: 'Isolation transformer',
  currentLimited: 'Current-limited first power-up',
  discharge: 'Discharge and verify before touching',
};
const flag = yesNo();

/** A caution in safety colours; its content is paragraphs only. */
export const hazardNoteAttrs = z
  .object({
    id: blockId,
    level: z.enum(SIGNAL_LEVELS),
    flags: added(
      z
        .object(Object.fromEntries(HAZARD_FLAGS.map((f) => [f, flag])) as Record<HazardFlag, typeof flag>, {
          error: (iss) =>
            iss.code === 'unrecognized_keys'
              ? `unknown flag ${iss.keys.map((k) => `"${k}"`).join(', ')} (flags: ${HAZARD_FLAGS.join(', ')})`
              : 'must be a set of yes/no flags',
        })
        .strict(),
    ),
  })
  .strict();
export type HazardNoteAttrs = z.infer<typeof hazardNoteAttrs>;

/** The flags a note carries, in words, in their fixed order. */
export const hazardFlagList = (a: HazardNoteAttrs): string[] =>
  HAZARD_FLAGS.filter((f) => a.flags?.[f]).map((f) => HAZARD_FLAG_LABELS[f]);

/** The flags a hazard note carries, in words ("Work one hand only; Isolation transformer"), '' for none. */
export const hazardFlagWords = (a: HazardNoteAttrs): string => hazardFlagList(a).join('; ');

export const hazardNote = defineNode({
  attrs: hazardNoteAttrs,
  content: 'paragraph',
  label: 'hazard note',
  many: 'hazardNotes',
  // The flags stay null until the author ticks one.
  defaults: { id: '', level: 'danger', flags: null },
  text: (a, _node, inner) => {
    // Only a note with flags gains a line, so text stored before flags existed reads the same.
    const flags = hazardFlagWords(a);
    return [...(flags ? [`Hazard note states: ${flags}`] : []), ...inner()];
  },
  html: (a, { children }) => {
    const flags = hazardFlagWords(a);
    return `<aside class="hazard-note hazard-${esc(a.level)}"><p><strong>${SAFETY_SIGNS[a.level].word}</strong></p>${flags ? `<p><em>${esc(flags)}</em></p>` : ''}${children()}</aside>`;
  },
  step: (a, { node, section, position }) => {
    const flags = hazardFlagList(a);
    return {
      id: a.id,
      kind: 'hazard',
      position,
      section,
      // One line per paragraph, so the note reads as written.
      text: (node.content ?? []).map(textOf).join('\n').trim(),
      hazard: { level: a.level, ...(flags.length ? { flags } : {}) },
    };
  },
});
