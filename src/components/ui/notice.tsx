import type { ReactNode } from 'react';

type Tone = 'info' | 'error' | 'success';
const tones: Record<Tone, string> = {
  info: 'border-rule bg-card',
  error: 'border-out bg-out-wash text-out',
  success: 'border-accent bg-accent-wash text-accent-deep',
};

export function Notice({ tone = 'info', children }: { tone?: Tone; children: ReactNode }) {
  return (
    <div
      role={tone === 'error' ? 'alert' : 'status'}
      className={`rounded-md border px-4 py-3 text-sm ${tones[tone]}`}
    >
      {children}
    </div>
  );
}
