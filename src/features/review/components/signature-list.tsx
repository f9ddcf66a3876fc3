import { useSignatures } from '../api/review-queries';
import { SignatureBadge } from './signature-badge';

/** All sign-offs of a revision, for the reader page (any signed-in person who can see the revision). */
export function SignatureList({ revisionId }: { revisionId: string }) {
  const q = useSignatures(revisionId);
  // A failed read is this list's region's to show (with a retry); the rest of the page stays.
  if (q.isError) throw q.error;
  if (!q.data?.signatures.length) return null;
  return (
    <section aria-label="Sign-offs" className="flex flex-col gap-2">
      {q.data.signatures.map((s) => (
        <SignatureBadge key={s.id} signature={s} />
      ))}
    </section>
  );
}
