/** Nearest known name to a mistyped one (Levenshtein distance), for "did you mean" hints. */
import { distance } from 'fastest-levenshtein';

export function closestName(typed: string, known: readonly string[]): string | null {
  const t = typed.toLowerCase();
  let best: string | null = null;
  let bestD = Infinity;
  for (const k of known) {
    const d = distance(t, k.toLowerCase());
    if (d < bestD) {
      best = k;
      bestD = d;
    }
  }
  // A hint is only worth giving when the names share most of their letters (or one contains the other).
  const related = best !== null && (bestD <= Math.max(2, Math.floor(best.length / 3)) || best.toLowerCase().includes(t) || t.includes(best.toLowerCase()));
  return related ? best : null;
}
