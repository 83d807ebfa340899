import { Button } from './button';

export interface PageNavProps {
  /** Accessible name of the navigation, e.g. "Pages of vehicles". */
  label: string;
  /** What the rows are, capitalised, for the "Vehicles 26–50 of 130" line. */
  noun: string;
  /** 1-based page shown. */
  page: number;
  pageSize: number;
  /** Rows in all pages. */
  total: number;
  onPage: (page: number) => void;
}

/**
 * The line under a list the API pages: which rows are shown out of how many, and (when there is
 * more than one page) previous and next. The count is a live status, so a screen reader hears it
 * after a page turn.
 */
export function PageNav({ label, noun, page, pageSize, total, onPage }: PageNavProps) {
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav aria-label={label} className="flex flex-wrap items-center justify-between gap-3">
      <p className="text-ink-muted" role="status">
        {noun} {first}–{last} of {total}
      </p>
      {pageCount > 1 && (
        <div className="flex items-center gap-2">
          <Button variant="secondary" size="sm" disabled={page <= 1} onClick={() => onPage(page - 1)}>
            Previous page
          </Button>
          <span className="tabular">
            Page {page} of {pageCount}
          </span>
          <Button variant="secondary" size="sm" disabled={page >= pageCount} onClick={() => onPage(page + 1)}>
            Next page
          </Button>
        </div>
      )}
    </nav>
  );
}
