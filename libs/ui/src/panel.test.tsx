import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { Panel } from './panel';

describe('Panel', () => {
  it('is a region named by its heading, with its actions and content', () => {
    render(
      <Panel title="Labour" actions={<button type="button">Add labour</button>}>
        <p>Two hours booked.</p>
      </Panel>,
    );
    const region = screen.getByRole('region', { name: 'Labour' });
    expect(region).toContainElement(screen.getByRole('heading', { level: 2, name: 'Labour' }));
    expect(region).toContainElement(screen.getByRole('button', { name: 'Add labour' }));
    expect(region).toHaveTextContent('Two hours booked.');
  });

  it('keeps a given heading id, and makes distinct ones otherwise', () => {
    render(
      <>
        <Panel title="Details" id="details-title">
          <p>a</p>
        </Panel>
        <Panel title="Fitment">
          <p>b</p>
        </Panel>
        <Panel title="Links">
          <p>c</p>
        </Panel>
      </>,
    );
    expect(screen.getByRole('heading', { name: 'Details' })).toHaveAttribute('id', 'details-title');
    const made = [screen.getByRole('heading', { name: 'Fitment' }).id, screen.getByRole('heading', { name: 'Links' }).id];
    expect(made[0]).not.toBe(made[1]);
    expect(screen.getByRole('region', { name: 'Links' })).toBeInTheDocument();
  });
});
