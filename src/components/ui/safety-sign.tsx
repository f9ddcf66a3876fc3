import type { ReactNode } from 'react';
import { signFor, WARNING_TRIANGLE, type SignalLevel } from '@shared/safety-signs';

/** The warning triangle of shared/safety-signs.ts (ISO 3864 general warning). */
export function WarningTriangle({ className = 'size-6' }: { className?: string }) {
  const t = WARNING_TRIANGLE;
  return (
    <svg viewBox={t.viewBox} className={`shrink-0 ${className}`} aria-hidden="true">
      <path d={t.outline} fill={t.field} stroke={t.ink} strokeWidth="4" strokeLinejoin="round" />
      <rect {...t.bar} rx="1.5" fill={t.ink} />
      <circle {...t.dot} fill={t.ink} />
    </svg>
  );
}

/** The signal-word band: the standard colour, the triangle where it belongs, the word. */
export function SignalWord({ level, size = 'md' }: { level: SignalLevel | 'note'; size?: 'sm' | 'md' }) {
  const sign = signFor(level);
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-sm font-bold tracking-wider ${size === 'sm' ? 'px-1.5 py-0.5 text-xs' : 'px-2 py-1 text-sm'}`}
      style={{ backgroundColor: sign.field, color: sign.ink }}
      title={`${sign.word}: ${sign.meaning}`}
    >
      {sign.triangle && <WarningTriangle className={size === 'sm' ? 'size-4' : 'size-5'} />}
      {sign.word}
    </span>
  );
}

/**
 * A safety sign with its message: the band on top, the message below on the page's own paper, the
 * frame in the sign's colour. Used by hazard notes, reckoner cautions, bench steps and the run sheet.
 */
export function SafetySign({
  level,
  children,
  as: Tag = 'aside',
  className = '',
}: {
  level: SignalLevel | 'note';
  children: ReactNode;
  as?: 'aside' | 'div' | 'li';
  className?: string;
}) {
  const sign = signFor(level);
  return (
    <Tag
      className={`safety-sign not-prose overflow-hidden rounded-md border-4 bg-card ${className}`}
      style={{ borderColor: sign.field }}
      data-signal={sign.word.toLowerCase()}
    >
      <div className="flex items-center px-2 py-1" style={{ backgroundColor: sign.field, color: sign.ink }}>
        <span className="inline-flex items-center gap-2 font-bold tracking-wider">
          {sign.triangle && <WarningTriangle className="size-6" />}
          {sign.word}
        </span>
      </div>
      <div className="p-3 text-graphite">{children}</div>
    </Tag>
  );
}
