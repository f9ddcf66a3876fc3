import type { OutboxItemView } from '@shared/schemas/review';

const utc = (iso: string) => iso.slice(0, 16).replace('T', ' ');

/** Each queued message; the plain-text body opens in place. */
export function OutboxTable({ items }: { items: OutboxItemView[] }) {
  if (!items.length) return <p className="text-graphite-soft">No mail here.</p>;
  return (
    <ul aria-label="Outbox" className="flex flex-col gap-2">
      {items.map((m) => (
        <li key={m.id} className="rounded-lg border border-rule bg-card p-3 text-sm" data-status={m.status}>
          <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
            <strong>{m.subject}</strong>
            <span>to {m.to.join(', ')}</span>
            <span className="text-graphite-soft">{m.reason}</span>
            <span className="ml-auto">
              {m.status === 'sent' ? (
                <span className="text-ok">sent {m.sentAt && utc(m.sentAt)} UTC</span>
              ) : (
                <span className="font-semibold text-out">pending — next try {utc(m.nextAttemptAt)} UTC</span>
              )}
            </span>
          </div>
          <p className="mt-1 text-xs text-graphite-soft">
            queued {utc(m.createdAt)} UTC · attempts <span className="value">{m.attempts}</span>
            {m.lastError && <span className="text-out"> · last error: {m.lastError}</span>}
          </p>
          <details className="mt-2">
            <summary className="cursor-pointer text-accent underline">Text of the message</summary>
            <pre className="mt-2 whitespace-pre-wrap rounded bg-paper p-2 font-mono text-xs">{m.text}</pre>
          </details>
        </li>
      ))}
    </ul>
  );
}
