import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { RoleWelcome } from './role-welcome';

const shop = { shopId: '4d7f1c2e-8a9b-4c3d-9e1f-0a1b2c3d4e5f', shopName: 'Harbour Works', spendingLimitMinor: null };

describe('RoleWelcome', () => {
  it('tells an owner what is theirs and where to start', () => {
    render(<RoleWelcome firstName="Ada" membership={{ ...shop, role: 'owner' }} shopCount={1} />);
    expect(screen.getByText('Owner')).toBeInTheDocument();
    expect(screen.getByText(/its staff and their roles, and its billing are yours to manage/)).toBeInTheDocument();
    expect(screen.getByText(/Invoice customers and record payments under Sales/)).toBeInTheDocument();
  });

  it('does not tell a platform admin under a support grant that the shop is theirs', () => {
    render(<RoleWelcome firstName="Support" membership={{ ...shop, role: 'owner', supportUntil: '2026-12-02T15:30:00.000Z' }} shopCount={2} />);
    expect(screen.getByText('Support access')).toBeInTheDocument();
    expect(screen.queryByText('Owner')).not.toBeInTheDocument();
    expect(screen.queryByText(/are yours to manage/)).not.toBeInTheDocument();
    expect(screen.getByText(/under the owner’s support grant/)).toBeInTheDocument();
    expect(screen.getByText(/under the owner’s support grant/).querySelector('time')).toHaveAttribute('dateTime', '2026-12-02T15:30:00.000Z');
    expect(screen.queryByText(/Switch shop/)).not.toBeInTheDocument();
  });

  it('gives a buyer their spending limit and a mechanic their jobs', () => {
    const { unmount } = render(<RoleWelcome firstName="Bo" membership={{ ...shop, role: 'buyer', spendingLimitMinor: 50_000 }} shopCount={1} />);
    expect(screen.getByText(/Your spending limit per purchase order/)).toHaveTextContent('500.00');
    unmount();
    render(<RoleWelcome firstName="Mo" membership={{ ...shop, role: 'mechanic' }} shopCount={1} />);
    expect(screen.getByText(/Your jobs are under Jobs/)).toBeInTheDocument();
  });
});
