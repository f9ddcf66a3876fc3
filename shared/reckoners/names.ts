/** Nearest known name to a mistyped one, for "did you mean" hints. */
import { distance } from 'fastest-levenshtein';

export function closestName(typed: string, known: readonly string[]): string | null {
  const t = typed.toLowerCase();
  // A name the typed one is part of ("resistance" → "bleederResistance") beats a merely similar one.
  const containing = known.filter((k) => k.toLowerCase().includes(t) || t.includes(k.toLowerCase()));
  if (t.length >= 4 && containing.length) return containing.sort((a, b) => a.length - b.length)[0]!;
  let best: string | null = null;
  let bestD = Infinity;
  for (const k of known) {
    const d = distance(t, k.toLowerCase());
    if (d < bestD) {
      best = k;
      bestD = d;
    }
  }
  // Only worth saying when the names share most of their letters (Levenshtein distance, small).
  return best !== null && bestD <= Math.max(2, Math.floor(best.length / 3)) ? best : null;
}
