import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Checklist, ItemRecord, RecordItemInput } from '@tappet/contracts';
import { recommissioningTemplate } from '@tappet/domain';
import { describe, expect, it, vi } from 'vitest';
import { ChecklistItemCard, recordSummary } from './checklist-item';

const item = (key: string): Checklist['items'][number] => recommissioningTemplate.items.find((i) => i.key === key)!;

const record = (over: Partial<ItemRecord>): ItemRecord => ({
  result: 'ok',
  note: null,
  value: null,
  compressionKPa: null,
  compressionSpreadPercent: null,
  tyres: null,
  suggested: null,
  photoFileId: null,
  recordedBy: null,
  recordedAt: '2026-01-15T10:00:00.000Z',
  ...over,
});

describe('recordSummary', () => {
  it('shows compression stored in kPa in the shop’s unit (NIST SP 811: 1 bar = 100 kPa; 1 psi = 6.894 757 kPa)', () => {
    expect(recordSummary(item('compression'), record({ compressionKPa: [950, 920], compressionSpreadPercent: 3.16 }), 'bar')).toBe('#1 9.5\u00a0bar, #2 9.2\u00a0bar · spread 3.2\u00a0%');
    expect(recordSummary(item('compression'), record({ compressionKPa: [689.4757293168361] }), 'psi')).toBe('#1 100\u00a0psi');
  });
  it('names a tyre made before 2000', () => {
    const tyres = [{ position: 'Rear', code: 'DOT AB 268', verdict: 'fail' as const, ageYears: 26, pre2000: true }];
    expect(recordSummary(item('tyre-age'), record({ result: 'fail', tyres }), 'psi')).toBe('Rear DOT AB 268: made before 2000 (Fail)');
  });
});

describe('ChecklistItemCard', () => {
  it('sends compression readings in the shop’s unit, with the cautions of the item on show', async () => {
    const onSave = vi.fn<(input: RecordItemInput) => Promise<void>>().mockResolvedValue(undefined);
    render(<ChecklistItemCard item={item('compression')} record={undefined} signedOff={false} editable pressureUnit="bar" saving={false} onSave={onSave} />);
    await userEvent.click(screen.getByRole('button', { name: 'Record: Compression per cylinder' }));
    await userEvent.type(screen.getByLabelText('Cylinder 1'), '9.5');
    await userEvent.type(screen.getByLabelText('Cylinder 2'), '9.2');
    await userEvent.click(screen.getByRole('button', { name: 'Add cylinder' }));
    await userEvent.type(screen.getByLabelText('Cylinder 3'), '9.4');
    await userEvent.click(screen.getByLabelText('OK', { exact: true }));
    await userEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(onSave).toHaveBeenCalledWith({ result: 'ok', note: null, photoFileId: null, compression: { unit: 'bar', readings: [9.5, 9.2, 9.4] } });
  });

  it('asks for a result before saving, and shows the brake-fluid caution on a brake item', async () => {
    const onSave = vi.fn<(input: RecordItemInput) => Promise<void>>();
    render(<ChecklistItemCard item={item('brake-hydraulics')} record={undefined} signedOff={false} editable pressureUnit="psi" saving={false} onSave={onSave} />);
    await userEvent.click(screen.getByRole('button', { name: /Record: Calipers/ }));
    expect(screen.getByRole('note', { name: 'Safety caution: Brake fluids do not mix' })).toBeInTheDocument();
    expect(screen.getByRole('note', { name: 'Safety caution: Asbestos in old linings' })).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(screen.getByText(/Choose a result/)).toBeInTheDocument();
    expect(onSave).not.toHaveBeenCalled();
  });

  it('attaches one of the job’s photos to the item and shows it once recorded', async () => {
    const onSave = vi.fn<(input: RecordItemInput) => Promise<void>>().mockResolvedValue(undefined);
    const photos = [
      { id: '00000000-0000-4000-8000-0000000000f1', label: 'Seized caliper', thumbnailHref: '/t1', href: '/c1' },
      { id: '00000000-0000-4000-8000-0000000000f2', label: 'Leaking hose', thumbnailHref: '/t2', href: '/c2' },
    ];
    const { rerender } = render(<ChecklistItemCard item={item('brake-hydraulics')} record={undefined} signedOff={false} editable pressureUnit="psi" saving={false} onSave={onSave} photos={photos} />);
    await userEvent.click(screen.getByRole('button', { name: /Record: Calipers/ }));
    await userEvent.click(screen.getByLabelText('Fail', { exact: true }));
    await userEvent.selectOptions(screen.getByLabelText('Photo of this item'), 'Leaking hose');
    await userEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(onSave).toHaveBeenCalledWith({ result: 'fail', note: null, photoFileId: photos[1]!.id });
    rerender(<ChecklistItemCard item={item('brake-hydraulics')} record={record({ result: 'fail', photoFileId: photos[1]!.id })} signedOff={false} editable pressureUnit="psi" saving={false} onSave={onSave} photos={photos} />);
    expect(screen.getByRole('link', { name: 'Photo of this item: Leaking hose' })).toHaveAttribute('href', '/c2');
  });

  it('shows a signed-off failed item as unresolved and offers no form to a reader', () => {
    render(<ChecklistItemCard item={item('brake-hydraulics')} record={record({ result: 'fail' })} signedOff editable={false} pressureUnit="psi" saving={false} onSave={vi.fn()} />);
    expect(screen.getByText('Unresolved: signed off by the owner')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Change/ })).not.toBeInTheDocument();
  });
});
