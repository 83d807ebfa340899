import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { MenuButton } from './menu-button';

function setup() {
  const picked = vi.fn();
  render(
    <MenuButton
      label="Switch shop"
      items={[
        { key: 'a', label: 'Harbour Works', detail: 'Owner', current: true, onSelect: () => picked('a') },
        { key: 'b', label: 'Brackenfold Garage', detail: 'Viewer', onSelect: () => picked('b') },
      ]}
    />,
  );
  return { picked, user: userEvent.setup() };
}

describe('MenuButton', () => {
  it('opens on the current item, moves with arrows and selects with Enter', async () => {
    const { picked, user } = setup();
    const button = screen.getByRole('button', { name: 'Switch shop' });
    expect(button).toHaveAttribute('aria-expanded', 'false');
    button.focus();
    await user.keyboard('{ArrowDown}');
    expect(button).toHaveAttribute('aria-expanded', 'true');
    expect(screen.getByRole('menuitem', { name: 'Harbour Works' })).toHaveFocus();
    expect(screen.getByRole('menuitem', { name: 'Harbour Works' })).toHaveAttribute('aria-current', 'true');
    await user.keyboard('{ArrowDown}');
    expect(screen.getByRole('menuitem', { name: 'Brackenfold Garage' })).toHaveFocus();
    await user.keyboard('{Enter}');
    expect(picked).toHaveBeenCalledWith('b');
    expect(screen.queryByRole('menu')).not.toBeInTheDocument();
    expect(button).toHaveFocus();
  });

  it('closes on Esc without choosing', async () => {
    const { picked, user } = setup();
    await user.click(screen.getByRole('button', { name: 'Switch shop' }));
    expect(screen.getByRole('menu', { name: 'Switch shop' })).toBeInTheDocument();
    await user.keyboard('{Escape}');
    expect(screen.queryByRole('menu')).not.toBeInTheDocument();
    expect(picked).not.toHaveBeenCalled();
    expect(screen.getByRole('button', { name: 'Switch shop' })).toHaveFocus();
  });

  it('shows a short label but is named in full for assistive technology', async () => {
    const user = userEvent.setup();
    render(<MenuButton label="Actions" accessibleLabel="Actions for Pat Example" items={[{ key: 'd', label: 'Deactivate Pat Example', onSelect: () => undefined }]} />);
    const button = screen.getByRole('button', { name: 'Actions for Pat Example' });
    expect(button).toHaveTextContent(/^Actions$/);
    await user.click(button);
    expect(screen.getByRole('menu', { name: 'Actions for Pat Example' })).toBeInTheDocument();
  });
});
