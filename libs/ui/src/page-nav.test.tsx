import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { PageNav } from './page-nav';

describe('PageNav', () => {
  it('says which rows are shown and turns pages within bounds', async () => {
    const onPage = vi.fn();
    const { rerender } = render(<PageNav label="Pages of holds" noun="Holds" page={1} pageSize={50} total={120} onPage={onPage} />);
    const nav = screen.getByRole('navigation', { name: 'Pages of holds' });
    expect(within(nav).getByRole('status')).toHaveTextContent('Holds 1–50 of 120');
    expect(nav).toHaveTextContent('Page 1 of 3');
    expect(within(nav).getByRole('button', { name: 'Previous page' })).toBeDisabled();
    await userEvent.click(within(nav).getByRole('button', { name: 'Next page' }));
    expect(onPage).toHaveBeenLastCalledWith(2);

    rerender(<PageNav label="Pages of holds" noun="Holds" page={3} pageSize={50} total={120} onPage={onPage} />);
    expect(within(nav).getByRole('status')).toHaveTextContent('Holds 101–120 of 120');
    expect(within(nav).getByRole('button', { name: 'Next page' })).toBeDisabled();
    await userEvent.click(within(nav).getByRole('button', { name: 'Previous page' }));
    expect(onPage).toHaveBeenLastCalledWith(2);
  });

  it('offers no page buttons when everything fits on one page, and counts none as 0–0', () => {
    const { rerender } = render(<PageNav label="Pages" noun="Parts" page={1} pageSize={25} total={25} onPage={() => {}} />);
    expect(screen.getByRole('status')).toHaveTextContent('Parts 1–25 of 25');
    expect(screen.queryByRole('button')).toBeNull();
    rerender(<PageNav label="Pages" noun="Parts" page={1} pageSize={25} total={0} onPage={() => {}} />);
    expect(screen.getByRole('status')).toHaveTextContent('Parts 0–0 of 0');
  });
});
