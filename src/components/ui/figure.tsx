import type { Measure } from '@shared/reckoners';
import { MEASURE_WORDS } from '@shared/reckoners/measures';

/**
 * A long text result ("use a 1.6 A time-delay fuse …") is a sentence: it wraps like text. A figure
 * ("412 V") never breaks. The one rule for every result on screen: reader, editor and review.
 */
export const isSentence = (formatted: string) => formatted.length > 24 && /\s\S+\s/.test(formatted);

/**
 * A number with its unit in the monospace value face, and its measure (rms, peak, DC) beside it.
 * A figure stays on one line; a sentence (a long text result) wraps like text.
 */
export function Figure({
  formatted,
  measure,
  strong,
}: {
  formatted: string;
  measure: Measure | null;
  strong?: boolean;
}) {
  const word = measure ? MEASURE_WORDS[measure] : '';
  const sentence = isSentence(formatted);
  return (
    <span className={sentence ? 'break-words' : 'whitespace-nowrap'}>
      <span data-value className={`${sentence ? 'font-mono' : 'value'} ${strong ? 'font-semibold' : ''}`}>
        {formatted}
      </span>
      {word && formatted !== '—' && <span className="text-xs text-graphite-soft"> {word}</span>}
    </span>
  );
}
