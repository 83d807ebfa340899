import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { createColumnHelper, DataTable } from './data-table';

interface Row {
  number: string;
  description: string;
  onHand: number;
}

const col = createColumnHelper<Row>();
const columns = [
  col.accessor('number', { header: 'Number' }),
  col.accessor('description', { header: 'Description' }),
  col.accessor('onHand', { header: 'On hand', meta: { numeric: true } }),
];

const rows: Row[] = Array.from({ length: 25 }, (_, i) => ({
  number: `TP-${String(100 + i)}`,
  description: i % 5 === 0 ? `Gasket set ${i}` : `Spring ${i}`,
  onHand: (i * 7) % 11,
}));

function bodyColumn(index: number): string[] {
  const table = screen.getByRole('table');
  const bodyRows = within(table).getAllByRole('row').slice(1);
  return bodyRows.map((r) => within(r).getAllByRole('cell')[index]?.textContent ?? '');
}

describe('DataTable', () => {
  it('sorts by a header button and says so with aria-sort', async () => {
    const user = userEvent.setup();
    render(<DataTable caption="Parts" columns={columns} data={rows.slice(0, 6)} />);
    const header = screen.getByRole('columnheader', { name: /On hand/ });
    expect(header).toHaveAttribute('aria-sort', 'none');
    const button = within(header).getByRole('button', { name: /On hand/ });
    button.focus();
    await user.keyboard('{Enter}');
    expect(header).toHaveAttribute('aria-sort', 'ascending');
    const ascending = bodyColumn(2).map(Number);
    expect(ascending).toEqual([...ascending].sort((a, b) => a - b));
    await user.click(button);
    expect(header).toHaveAttribute('aria-sort', 'descending');
    const descending = bodyColumn(2).map(Number);
    expect(descending).toEqual([...descending].sort((a, b) => b - a));
  });

  it('pages through rows', async () => {
    const user = userEvent.setup();
    render(<DataTable caption="Parts" columns={columns} data={rows} pageSize={10} />);
    expect(bodyColumn(0)).toHaveLength(10);
    expect(screen.getByText('Rows 1–10 of 25')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Previous page' })).toBeDisabled();
    await user.click(screen.getByRole('button', { name: 'Next page' }));
    await user.click(screen.getByRole('button', { name: 'Next page' }));
    expect(screen.getByText('Page 3 of 3')).toBeInTheDocument();
    expect(bodyColumn(0)).toEqual(['TP-120', 'TP-121', 'TP-122', 'TP-123', 'TP-124']);
    expect(screen.getByRole('button', { name: 'Next page' })).toBeDisabled();
  });

  it('filters, goes back to the first page and offers to clear a filter that matches nothing', async () => {
    const user = userEvent.setup();
    render(<DataTable caption="Parts" columns={columns} data={rows} pageSize={10} filterLabel="Filter parts" />);
    await user.click(screen.getByRole('button', { name: 'Next page' }));
    await user.type(screen.getByLabelText('Filter parts'), 'gasket');
    expect(bodyColumn(1)).toEqual(['Gasket set 0', 'Gasket set 5', 'Gasket set 10', 'Gasket set 15', 'Gasket set 20']);
    expect(screen.getByRole('status')).toHaveTextContent('Rows 1–5 of 5');
    await user.clear(screen.getByLabelText('Filter parts'));
    await user.type(screen.getByLabelText('Filter parts'), 'carburettor');
    expect(screen.getByText('No rows match “carburettor”.')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Clear the filter' }));
    expect(bodyColumn(0)).toHaveLength(10);
  });

  it('shows the empty state when there are no rows at all', () => {
    render(<DataTable caption="Parts" columns={columns} data={[]} empty={<p>No parts yet. Import a catalogue.</p>} />);
    expect(screen.queryByRole('table')).not.toBeInTheDocument();
    expect(screen.getByText('No parts yet. Import a catalogue.')).toBeInTheDocument();
  });
});
