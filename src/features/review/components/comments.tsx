import { useId, useState, type FormEvent } from 'react';
import type { BlockRef, ReviewCommentView } from '@shared/schemas/review';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useAddComment } from '../api/review-mutations';
import { formatUtc } from './format';

export function CommentList({ comments }: { comments: ReviewCommentView[] }) {
  if (!comments.length) return <p className="text-sm text-graphite-soft">No comments yet.</p>;
  return (
    <ol className="flex flex-col gap-2">
      {comments.map((c) => (
        <li
          key={c.id}
          className="rounded-md border border-rule bg-card px-3 py-2 text-sm"
          data-block-id={c.blockId ?? undefined}
        >
          <p className="text-xs text-graphite-soft">
            <strong className="text-graphite">{c.author.displayName}</strong> ·{' '}
            <time dateTime={c.createdAt}>{formatUtc(c.createdAt)}</time>
            {c.blockLabel && <> · on {c.blockLabel}</>}
          </p>
          <p className="mt-1 whitespace-pre-wrap">{c.body}</p>
        </li>
      ))}
    </ol>
  );
}

/** A comment on the whole revision or, chosen from the list, on one of its blocks. */
export function CommentForm({ revisionId, blocks }: { revisionId: string; blocks: BlockRef[] }) {
  const id = useId();
  const add = useAddComment(revisionId);
  const [body, setBody] = useState('');
  const [blockId, setBlockId] = useState('');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    add.mutate({ body, blockId: blockId || null }, { onSuccess: () => setBody('') });
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-2">
      <label htmlFor={`${id}-block`} className="text-sm font-semibold">
        Comment on
      </label>
      <select
        id={`${id}-block`}
        className="min-h-11 rounded-md border border-rule bg-card px-3"
        value={blockId}
        onChange={(e) => setBlockId(e.target.value)}
      >
        <option value="">The whole revision</option>
        {blocks.map((b) => (
          <option key={b.id} value={b.id}>
            {b.label}
          </option>
        ))}
      </select>
      <label htmlFor={`${id}-body`} className="text-sm font-semibold">
        Comment
      </label>
      <textarea
        id={`${id}-body`}
        className="min-h-20 rounded-md border border-rule bg-card px-3 py-2"
        value={body}
        maxLength={4000}
        onChange={(e) => setBody(e.target.value)}
      />
      {add.error && <Notice tone="error">{add.error.message}</Notice>}
      <div>
        <Button type="submit" variant="quiet" disabled={add.isPending || !body.trim()}>
          Add comment
        </Button>
      </div>
    </form>
  );
}
