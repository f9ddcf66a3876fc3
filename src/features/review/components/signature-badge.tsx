import { useState } from 'react';
import type { SignatureView } from '@shared/schemas/review';
import { verifySignature } from '../api/review-queries';
import { formatUtc, MEANING_LABELS } from './format';

/**
 * One sign-off: meaning, printed name, role, UTC time, and whether the stored revision still matches
 * the signed content (checked by the server on every read; "Check again" asks once more).
 */
export function SignatureBadge({ signature }: { signature: SignatureView }) {
  const [check, setCheck] = useState<{ verified: boolean; at: string } | null>(null);
  const [checking, setChecking] = useState(false);
  const verified = check ? check.verified : signature.verified;
  const recheck = async () => {
    setChecking(true);
    try {
      const res = await verifySignature(signature.id);
      setCheck({ verified: res.verified, at: new Date().toISOString() });
    } finally {
      setChecking(false);
    }
  };
  return (
    <div
      data-signature={signature.meaning}
      className={`rounded-md border px-3 py-2 text-sm ${verified ? 'border-ok bg-card' : 'border-out bg-out-wash'}`}
    >
      <p>
        <strong>
          {MEANING_LABELS[signature.meaning]} by {signature.signer.displayName}
        </strong>{' '}
        <span className="text-graphite-soft">({signature.signer.role})</span> at{' '}
        <time className="value" dateTime={signature.signedAt}>
          {formatUtc(signature.signedAt)}
        </time>{' '}
        —{' '}
        {verified ? (
          <span className="font-semibold text-ok">content verified</span>
        ) : (
          <span role="alert" className="font-semibold text-out">
            content does NOT match what was signed
          </span>
        )}
      </p>
      {signature.comment && <p className="mt-1 whitespace-pre-wrap">“{signature.comment}”</p>}
      <p className="mt-1 flex flex-wrap items-center gap-2 text-xs text-graphite-soft">
        <span>
          Revision <span className="value">{signature.revisionNumber}</span> · SHA-256{' '}
          <span className="value" title={signature.contentHash}>
            {signature.contentHash.slice(0, 16)}…
          </span>
        </span>
        <button type="button" className="underline" onClick={recheck} disabled={checking}>
          {checking ? 'Checking…' : 'Check again'}
        </button>
        {check && <span>checked {formatUtc(check.at)}</span>}
      </p>
    </div>
  );
}
