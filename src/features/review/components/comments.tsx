import { z } from 'zod';
import { commentBody, type BlockRef, type ReviewCommentView } from '@shared/schemas/review';
import { Button } from '@/components/ui/button';
import { SelectField, TextareaField } from '@/components/ui/field';
import { FormProblem } from '@/components/ui/form-problem';
import { labelOf, showServerError, useZodForm } from '@/lib/form';
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

/** The list's "whole revision" choice is an empty value: no block. */
const commentForm = commentBody.extend({
  blockId: z
    .string()
    .transform((id): string | null | undefined => id || null)
    .pipe(commentBody.shape.blockId),
});

/** A comment on the whole revision or, chosen from the list, on one of its blocks. */
export function CommentForm({ revisionId, blocks }: { revisionId: string; blocks: BlockRef[] }) {
  const add = useAddComment(revisionId);
  const form = useZodForm(commentForm, { defaultValues: { body: '', blockId: '' } });
  const { errors } = form.formState;
  const submit = form.handleSubmit(({ body, blockId }) =>
    add.mutate(
      { body, blockId },
      {
        onSuccess: () => form.reset({ body: '', blockId: form.getValues('blockId') }),
        onError: (e) => showServerError(form, e),
      },
    ),
  );
  return (
    <form onSubmit={submit} className="flex flex-col gap-2" noValidate>
      <SelectField
        label={labelOf(commentForm, 'blockId')}
        {...form.register('blockId')}
        error={errors.blockId?.message}
      >
        <option value="">The whole revision</option>
        {blocks.map((b) => (
          <option key={b.id} value={b.id}>
            {b.label}
          </option>
        ))}
      </SelectField>
      <TextareaField
        label={labelOf(commentForm, 'body')}
        maxLength={4000}
        {...form.register('body')}
        error={errors.body?.message}
      />
      <FormProblem formState={form.formState} />
      <div>
        <Button type="submit" variant="quiet" disabled={add.isPending} whyDisabled="Adding the comment…">
          Add comment
        </Button>
      </div>
    </form>
  );
}
