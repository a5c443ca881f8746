import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { JobPhoto, JobPhotos } from '../../../shared/schemas/job-photos.ts';
import { JobPhotosPanel } from '../../../src/features/photos-on-job/components/job-photos-panel.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';

// Invented photos of an invented job: two on board DB1, one on the garage board.
const photo = (id: number, name: string, changes: Partial<JobPhoto> = {}): JobPhoto => ({
  id,
  mime: 'image/jpeg',
  originalName: name,
  uploadedBy: { id: 3, name: 'Tomas Tester' },
  uploadedAt: '2026-11-30T09:15:00.000Z',
  sendToClient: false,
  ...changes,
});

const threePhotos = (chosen: ReadonlySet<number> = new Set()): JobPhotos => ({
  boards: [
    { boardId: 1, reference: 'DB1', photos: [photo(21, 'sheet-1.jpg', { sendToClient: chosen.has(21) }), photo(22, 'sheet-2.jpg', { sendToClient: chosen.has(22) })] },
    { boardId: 2, reference: 'Garage', photos: [photo(23, 'garage.jpg', { sendToClient: chosen.has(23) })] },
  ],
});

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('photos of the notes on the job', () => {
  it('when the job has photos, then they show by board; Enter opens one large, arrows move between all the job\'s photos and Esc closes', async () => {
    stubApi({ 'GET /api/jobs/5/photos': () => json(200, threePhotos()) });
    const { user } = renderWithProviders(<JobPhotosPanel jobId={5} role="tester" />);

    const db1 = await screen.findByRole('group', { name: 'Board DB1' });
    expect(within(db1).getAllByRole('button')).toHaveLength(2);
    expect(within(screen.getByRole('group', { name: 'Board Garage' })).getAllByRole('button')).toHaveLength(1);
    // A tester sees the choice, not a checkbox to change it.
    expect(screen.queryByRole('checkbox')).not.toBeInTheDocument();
    expect(screen.getAllByText('Not sent to the client')).toHaveLength(3);

    const first = screen.getByRole('button', { name: 'Open Board DB1, sheet-1.jpg' });
    first.focus();
    await user.keyboard('{Enter}');
    const dialog = await screen.findByRole('dialog', { name: 'Photo 1 of 3: board DB1' });
    expect(within(dialog).getByRole('img', { name: 'Board DB1, sheet-1.jpg' })).toHaveAttribute('src', '/api/files/21');

    await user.keyboard('{ArrowRight}');
    expect(screen.getByRole('dialog', { name: 'Photo 2 of 3: board DB1' })).toBeInTheDocument();
    await user.keyboard('{ArrowRight}');
    expect(screen.getByRole('dialog', { name: 'Photo 3 of 3: board Garage' })).toBeInTheDocument();
    expect(screen.getByRole('img', { name: 'Board Garage, garage.jpg' })).toHaveAttribute('src', '/api/files/23');
    // The last photo stays the last.
    await user.keyboard('{ArrowRight}');
    expect(screen.getByRole('dialog', { name: 'Photo 3 of 3: board Garage' })).toBeInTheDocument();
    await user.keyboard('{ArrowLeft}{ArrowLeft}');
    expect(screen.getByRole('dialog', { name: 'Photo 1 of 3: board DB1' })).toBeInTheDocument();

    await user.keyboard('{Escape}');
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(first).toHaveFocus();
  });

  it('when a reviewer ticks "send with the document", then the choice is sent for that photo only and shown ticked', async () => {
    const chosen = new Set<number>();
    const calls = stubApi({
      'GET /api/jobs/5/photos': () => json(200, threePhotos(chosen)),
      'PUT /api/photos/22/send-choice': () => {
        chosen.add(22);
        return json(200, { photo: photo(22, 'sheet-2.jpg', { sendToClient: true }) });
      },
    });
    const { user } = renderWithProviders(<JobPhotosPanel jobId={5} role="reviewer" />);
    const box = await screen.findByRole('checkbox', { name: 'Send with the document: Board DB1, sheet-2.jpg' });
    expect(screen.getAllByRole('checkbox').map((c) => (c as HTMLInputElement).checked)).toEqual([false, false, false]);

    box.focus();
    await user.keyboard(' ');
    await waitFor(() => expect(box).toBeChecked());
    const puts = calls.filter((c) => c.method === 'PUT');
    expect(puts).toEqual([expect.objectContaining({ path: '/api/photos/22/send-choice', body: { sendToClient: true } })]);
    expect(screen.getAllByRole('checkbox').map((c) => (c as HTMLInputElement).checked)).toEqual([false, true, false]);
  });

  it('when the choice is refused, then the reason shows at the photo and the box stays as it was', async () => {
    stubApi({
      'GET /api/jobs/5/photos': () => json(200, threePhotos()),
      'PUT /api/photos/21/send-choice': () => json(403, { error: { code: 'forbidden', message: 'Only a reviewer or an admin may do this.' } }),
    });
    const { user } = renderWithProviders(<JobPhotosPanel jobId={5} role="admin" />);
    const box = await screen.findByRole('checkbox', { name: 'Send with the document: Board DB1, sheet-1.jpg' });
    await user.click(box);
    expect(await screen.findByRole('alert')).toHaveTextContent('Not changed: Only a reviewer or an admin may do this.');
    expect(box).not.toBeChecked();
  });

  it('when the job has no photo, then it says so', async () => {
    stubApi({ 'GET /api/jobs/5/photos': () => json(200, { boards: [] }) });
    renderWithProviders(<JobPhotosPanel jobId={5} role="reviewer" />);
    expect(await screen.findByText("No photo of the notes is attached to this job's boards.")).toBeInTheDocument();
  });
});
