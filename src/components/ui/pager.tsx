import { useId } from 'react';
import { WhyDisabled } from './button';

const pageButton = 'min-h-11 rounded-md border border-rule px-3 disabled:opacity-50';

/** Previous / next between numbered pages, with where the reader is; nothing when one page holds all. */
export function Pager({
  page,
  pages,
  onPage,
  label,
}: {
  page: number;
  pages: number;
  onPage: (page: number) => void;
  label: string;
}) {
  const id = useId();
  if (pages <= 1) return null;
  const why = page <= 1 ? 'This is the first page.' : page >= pages ? 'This is the last page.' : '';
  return (
    <nav aria-label={label} className="flex flex-wrap items-center gap-3 text-sm">
      <button
        type="button"
        disabled={page <= 1}
        aria-describedby={page <= 1 ? id : undefined}
        className={pageButton}
        onClick={() => onPage(page - 1)}
      >
        Previous
      </button>
      <span>
        Page {page} of {pages}
      </span>
      <button
        type="button"
        disabled={page >= pages}
        aria-describedby={page >= pages ? id : undefined}
        className={pageButton}
        onClick={() => onPage(page + 1)}
      >
        Next
      </button>
      <WhyDisabled id={id} why={why} />
    </nav>
  );
}
