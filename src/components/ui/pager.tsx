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
  if (pages <= 1) return null;
  return (
    <nav aria-label={label} className="flex items-center gap-3 text-sm">
      <button type="button" disabled={page <= 1} className={pageButton} onClick={() => onPage(page - 1)}>
        Previous
      </button>
      <span>
        Page {page} of {pages}
      </span>
      <button type="button" disabled={page >= pages} className={pageButton} onClick={() => onPage(page + 1)}>
        Next
      </button>
    </nav>
  );
}
