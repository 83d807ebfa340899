import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { PasswordField, Select, TextField } from './form-field';

describe('TextField', () => {
  it('labels the input and reads the hint as its description', () => {
    render(<TextField label="E-mail" hint="The address you were invited with." />);
    const input = screen.getByLabelText('E-mail');
    expect(input).toHaveAccessibleDescription('The address you were invited with.');
    expect(input).toBeValid();
  });

  it('marks the input invalid and announces the error before the hint', () => {
    render(<TextField label="E-mail" hint="The address you were invited with." error="Enter an e-mail address." />);
    const input = screen.getByLabelText('E-mail');
    expect(input).toBeInvalid();
    expect(input).toHaveAccessibleDescription('Enter an e-mail address. The address you were invited with.');
  });

  it('drops the error wiring once the error is gone', () => {
    const { rerender } = render(<TextField label="Name" error="Enter a name." />);
    expect(screen.getByLabelText('Name')).toBeInvalid();
    rerender(<TextField label="Name" />);
    expect(screen.getByLabelText('Name')).toBeValid();
    expect(screen.getByLabelText('Name')).not.toHaveAttribute('aria-describedby');
    expect(screen.queryByText('Enter a name.')).not.toBeInTheDocument();
  });
});

describe('PasswordField', () => {
  it('shows and hides the characters without changing its label', async () => {
    const user = userEvent.setup();
    render(<PasswordField label="Password" />);
    const input = screen.getByLabelText('Password');
    expect(input).toHaveAttribute('type', 'password');
    await user.click(screen.getByRole('button', { name: 'Show' }));
    expect(input).toHaveAttribute('type', 'text');
    expect(screen.getByRole('button', { name: 'Hide' })).toHaveAttribute('aria-pressed', 'true');
    // The toggle must not make "Password" ambiguous for people and tests finding the field.
    expect(screen.getAllByLabelText(/password/i)).toHaveLength(1);
  });
});

describe('Select', () => {
  it('offers the options under its label and reports the error', () => {
    render(
      <Select
        label="Role"
        placeholder="Choose a role"
        error="Choose a role."
        options={[
          { value: 'owner', label: 'Owner' },
          { value: 'viewer', label: 'Viewer' },
        ]}
      />,
    );
    const select = screen.getByLabelText('Role');
    expect(select).toBeInvalid();
    expect(select).toHaveAccessibleDescription('Choose a role.');
    expect(screen.getAllByRole('option').map((o) => o.textContent)).toEqual(['Choose a role', 'Owner', 'Viewer']);
  });
});
