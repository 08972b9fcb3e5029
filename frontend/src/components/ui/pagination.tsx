import { formatCount } from '@/lib/format';
import { Button } from '@/components/ui/button';

export interface PaginationProps {
  page: number;
  pageSize: number;
  total: number;
  /** The total is an estimate (large results are not counted exactly). */
  estimated?: boolean;
  onPageChange: (page: number) => void;
  onPageSizeChange?: (pageSize: number) => void;
  pageSizes?: number[];
}

export function Pagination({ page, pageSize, total, estimated = false, onPageChange, onPageSizeChange, pageSizes = [25, 50, 100, 200] }: PaginationProps) {
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <div className="mt-3 flex flex-wrap items-center justify-between gap-3 text-sm text-ink-700">
      <p className="num" aria-live="polite">
        {total === 0 ? 'No results' : `${formatCount(first)}–${formatCount(last)} of ${estimated ? 'about ' : ''}${formatCount(total)}`}
      </p>
      <div className="flex items-center gap-3">
        {onPageSizeChange ? (
          <label className="flex items-center gap-2">
            <span>Rows per page</span>
            <select
              className="h-8 rounded border border-paper-400 bg-white px-2 text-sm"
              value={pageSize}
              onChange={(event) => onPageSizeChange(Number(event.target.value))}
            >
              {(pageSizes.includes(pageSize) ? pageSizes : [...pageSizes, pageSize].sort((a, b) => a - b)).map((size) => (
                <option key={size} value={size}>
                  {size}
                </option>
              ))}
            </select>
          </label>
        ) : null}
        <div className="flex items-center gap-1" role="group" aria-label="Pages">
          <Button size="sm" onClick={() => onPageChange(page - 1)} disabled={page <= 1}>
            Previous page
          </Button>
          <span className="num px-2">
            Page {formatCount(page)} of {formatCount(pageCount)}
          </span>
          <Button size="sm" onClick={() => onPageChange(page + 1)} disabled={page >= pageCount}>
            Next page
          </Button>
        </div>
      </div>
    </div>
  );
}
