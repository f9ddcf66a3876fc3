/**
 * The safety-sign colours as theme colours, from the one definition in shared/safety-signs.ts:
 * `--color-sign-<level>` and `--color-sign-<level>-ink` on :root, and the matching utilities
 * (`bg-sign-danger`, `text-sign-caution-ink`, `border-sign-warning`, …). Loaded by styles.css with
 * `@plugin`; nothing else in the styles names a hazard colour.
 */
import plugin from 'tailwindcss/plugin';
import { SAFETY_SIGNS, SIGNAL_LEVELS } from '../shared/safety-signs';

export const signColours = Object.fromEntries(
  SIGNAL_LEVELS.flatMap((level) => [
    [`sign-${level}`, SAFETY_SIGNS[level].field],
    [`sign-${level}-ink`, SAFETY_SIGNS[level].ink],
  ]),
);

export default plugin(
  ({ addBase }) => {
    addBase({
      ':root': Object.fromEntries(Object.entries(signColours).map(([k, v]) => [`--color-${k}`, v])),
    });
  },
  {
    theme: {
      extend: {
        colors: Object.fromEntries(Object.keys(signColours).map((k) => [k, `var(--color-${k})`])),
      },
    },
  },
);
