import { act, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import type { OpenApiDocument } from '../lib/openapi';
import { ApiReference } from './api-reference';

const doc: OpenApiDocument = {
  openapi: '3.1.0',
  info: { title: 'Tappet API', version: '0.1.0' },
  paths: {
    '/api/shops/{shopId}/parts': {
      get: { summary: 'List parts', tags: ['catalogue'], parameters: [{ name: 'q', in: 'query', schema: { type: 'string' } }], responses: { '200': { description: 'One page of parts' } } },
      post: { summary: 'Add a part', tags: ['catalogue'], responses: { '201': { description: 'The new part' } } },
    },
  },
};

afterEach(() => window.history.replaceState(null, '', '/'));

describe('the API reference', () => {
  it('folds each operation to its method, path and summary until it is opened', async () => {
    const user = userEvent.setup();
    render(<ApiReference doc={doc} />);
    const card = document.getElementById('get-api-shops-shopid-parts')!;
    expect(card.tagName).toBe('DETAILS');
    expect(within(card).getByText('List parts')).toBeInTheDocument();
    // Folded: the parameters and responses are not rendered at all.
    expect(within(card).queryByText('One page of parts')).not.toBeInTheDocument();
    await user.click(within(card).getByRole('heading', { name: /\/api\/shops\/\{shopId\}\/parts/ }));
    expect(await within(card).findByText('One page of parts')).toBeInTheDocument();
    expect(within(card).getByText('Parameters')).toBeInTheDocument();
  });

  it('opens the operation a link points at', async () => {
    render(<ApiReference doc={doc} />);
    const card = document.getElementById('post-api-shops-shopid-parts')!;
    expect(within(card).queryByText('The new part')).not.toBeInTheDocument();
    await act(async () => {
      window.location.hash = '#post-api-shops-shopid-parts';
      window.dispatchEvent(new HashChangeEvent('hashchange'));
    });
    expect(await screen.findByText('The new part')).toBeInTheDocument();
  });
});
