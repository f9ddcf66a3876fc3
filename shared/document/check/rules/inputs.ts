import type { Rule } from '../types';
import { capitalise, inputProblem, reckonerName } from '../words';

/** A reckoner whose inputs cannot be used: each problem named by the input's label. */
export const reckonerInputErrors: Rule = {
  code: 'reckoner-input-error',
  level: 'warning',
  run: ({ snapshot }) =>
    snapshot.blocks.flatMap((block) =>
      block.ok
        ? []
        : block.errors.map((e) => {
            const said = inputProblem(block.kind, e.field, e.reason);
            return {
              blockId: block.id,
              message: `${capitalise(reckonerName(block))}: ${said}${/[.?!]$/.test(said) ? '' : '.'}`,
            };
          }),
    ),
};

/** Problems of the procedure as a whole: two blocks with one name, blocks referring to each other in a cycle. */
export const procedureErrors: Rule = {
  code: 'procedure-error',
  level: 'warning',
  run: ({ snapshot }) =>
    snapshot.errors.map((e) => ({
      blockId: null,
      message: `${e.message.charAt(0).toUpperCase()}${e.message.slice(1)}.`,
    })),
};

/** A procedure that powers a unit from the mains (it has reckoners or readings) sizes its fuse. */
export const fuseReckonerMissing: Rule = {
  code: 'fuse-reckoner-missing',
  level: 'warning',
  run: ({ blocks: { reckoners, readings } }) =>
    (reckoners.length > 0 || readings.length > 0) && !reckoners.some((r) => r.kind === 'mains-fuse')
      ? [{ blockId: null, message: 'This mains-powered procedure has no mains-fuse reckoner.' }]
      : [],
};
