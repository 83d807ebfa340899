import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { StatusPill } from './badge';
import { Button } from './button';
import { Caution } from './caution';

describe('Button', () => {
  it('ignores clicks while loading and says it is busy', async () => {
    const user = userEvent.setup();
    const onClick = vi.fn();
    const { rerender } = render(
      <Button loading onClick={onClick}>
        Save
      </Button>,
    );
    const button = screen.getByRole('button', { name: 'Save' });
    expect(button).toHaveAttribute('aria-busy', 'true');
    await user.click(button);
    expect(onClick).not.toHaveBeenCalled();
    rerender(<Button onClick={onClick}>Save</Button>);
    await user.click(button);
    expect(onClick).toHaveBeenCalledOnce();
  });
});

describe('StatusPill', () => {
  it('carries a word, not colour alone', () => {
    render(
      <>
        <StatusPill status="advise" />
        <StatusPill status="na" />
        <StatusPill status="fail" label="Replace" />
      </>,
    );
    expect(screen.getByText('Advise')).toBeInTheDocument();
    expect(screen.getByText('Not applicable')).toBeInTheDocument();
    expect(screen.getByText('Replace')).toBeInTheDocument();
  });
});

describe('Caution', () => {
  it('is a named note that says Caution', () => {
    render(<Caution title="Brake hydraulics">Bleed the system after opening it.</Caution>);
    const note = screen.getByRole('note', { name: 'Safety caution: Brake hydraulics' });
    expect(note).toHaveTextContent('Caution');
    expect(note).toHaveTextContent('Bleed the system after opening it.');
  });
});
