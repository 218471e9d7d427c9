import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { SamplePicker, type SampleChoice } from '@/components/surface-energy/sample-picker';

const push = vi.fn();
vi.mock('next/navigation', () => ({ useRouter: () => ({ push }) }));

const choice = (coatingCode: string, lotCode: string, sampleLabel: string): SampleChoice => ({
  coatingId: `coating-${coatingCode}`,
  coatingCode,
  coatingName: coatingCode === 'HT-200' ? 'Hydrophobic topcoat' : 'Plasma-treated film',
  batchId: `batch-${lotCode}`,
  lotCode,
  sampleId: `sample-${lotCode}-${sampleLabel}`,
  sampleLabel,
});

const CHOICES = [
  choice('HT-200', 'B-0412', 'P1'),
  choice('HT-200', 'B-0412', 'P2'),
  choice('HT-200', 'B-0405', 'P1'),
  choice('PP-Print', 'F-2611', 'D1'),
];

const options = (label: string) =>
  [...(screen.getByLabelText(label) as HTMLSelectElement).options].map((o) => o.text);

beforeEach(() => push.mockClear());

describe('surface-energy sample picker', () => {
  it('narrows coating → batch → sample, one step at a time', async () => {
    render(<SamplePicker choices={CHOICES} selectedSampleId={null} selectedBatchId={null} />);
    expect((screen.getByLabelText('Batch') as HTMLSelectElement).disabled).toBe(true);
    expect(options('Coating')).toEqual([
      'Choose a coating…',
      'HT-200 — Hydrophobic topcoat',
      'PP-Print — Plasma-treated film',
    ]);
    await userEvent.selectOptions(screen.getByLabelText('Coating'), 'coating-HT-200');
    expect(options('Batch')).toEqual(['Choose a batch…', 'B-0412', 'B-0405']);
    await userEvent.selectOptions(screen.getByLabelText('Batch'), 'batch-B-0412');
    expect(options('Sample')).toEqual(['Choose a sample…', 'All samples of the batch', 'P1', 'P2']);
    await userEvent.selectOptions(screen.getByLabelText('Sample'), 'sample-B-0412-P2');
    expect(push).toHaveBeenCalledWith('/surface-energy?sample=sample-B-0412-P2');
  });

  it('opens the whole batch, and a new coating clears the batch chosen before', async () => {
    render(<SamplePicker choices={CHOICES} selectedSampleId={null} selectedBatchId={null} />);
    await userEvent.selectOptions(screen.getByLabelText('Coating'), 'coating-HT-200');
    await userEvent.selectOptions(screen.getByLabelText('Batch'), 'batch-B-0405');
    await userEvent.selectOptions(screen.getByLabelText('Sample'), 'All samples of the batch');
    expect(push).toHaveBeenCalledWith('/surface-energy?batch=batch-B-0405');

    await userEvent.selectOptions(screen.getByLabelText('Coating'), 'coating-PP-Print');
    expect((screen.getByLabelText('Batch') as HTMLSelectElement).value).toBe('');
    expect((screen.getByLabelText('Sample') as HTMLSelectElement).disabled).toBe(true);
  });

  it('shows the sample or batch on screen as chosen', () => {
    const { unmount } = render(
      <SamplePicker choices={CHOICES} selectedSampleId="sample-F-2611-D1" selectedBatchId={null} />,
    );
    expect((screen.getByLabelText('Coating') as HTMLSelectElement).value).toBe('coating-PP-Print');
    expect((screen.getByLabelText('Sample') as HTMLSelectElement).value).toBe('sample-F-2611-D1');
    unmount();
    render(
      <SamplePicker choices={CHOICES} selectedSampleId={null} selectedBatchId="batch-B-0412" />,
    );
    expect((screen.getByLabelText('Batch') as HTMLSelectElement).value).toBe('batch-B-0412');
    expect((screen.getByLabelText('Sample') as HTMLSelectElement).value).toBe('__batch__');
  });
});
