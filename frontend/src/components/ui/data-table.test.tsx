import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { createColumnHelper, getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { DataTable } from '@/components/ui/data-table';

const column = createColumnHelper<{ a: string }>();
function Table() {
  const table = useReactTable({ data: [{ a: 'one' }], columns: [column.accessor('a', { header: 'A' })], getCoreRowModel: getCoreRowModel() });
  return <DataTable table={table} caption="Readings of the session" empty="None" />;
}

describe('DataTable', () => {
  it('makes a table wider than its box reachable by the keyboard, as a named region (axe scrollable-region-focusable)', () => {
    // jsdom lays nothing out: give the box a narrower width than its content.
    Object.defineProperty(HTMLElement.prototype, 'scrollWidth', { configurable: true, get: () => 1800 });
    Object.defineProperty(HTMLElement.prototype, 'clientWidth', { configurable: true, get: () => 1200 });
    try {
      render(<Table />);
      const region = screen.getByRole('region', { name: 'Readings of the session (scrolls sideways)' });
      expect(region.getAttribute('tabindex')).toBe('0');
    } finally {
      delete (HTMLElement.prototype as { scrollWidth?: number }).scrollWidth;
      delete (HTMLElement.prototype as { clientWidth?: number }).clientWidth;
    }
  });

  it('adds no tab stop to a table that fits', () => {
    render(<Table />);
    expect(screen.queryByRole('region')).toBeNull();
    expect(screen.getByRole('table').parentElement?.getAttribute('tabindex')).toBeNull();
  });
});
