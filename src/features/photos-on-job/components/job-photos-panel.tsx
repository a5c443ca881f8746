import { useId, useLayoutEffect, useRef, useState, type KeyboardEvent as ReactKeyboardEvent } from 'react';
import type { Role } from '../../../../shared/schemas/common.ts';
import type { JobPhoto, JobPhotos } from '../../../../shared/schemas/job-photos.ts';
import { FormDialog } from '../../../components/form-dialog.tsx';
import { useJobPhotos } from '../api/get-job-photos.ts';
import { useSetPhotoSendChoice } from '../api/set-photo-send-choice.ts';

export interface JobPhotosPanelProps {
  jobId: number;
  /** The signed-in person's role: a reviewer or an admin chooses which photos go to the client. */
  role: Role | null;
}

/** A photo with the board it belongs to, in the order the panel shows them. */
interface PlacedPhoto {
  photo: JobPhoto;
  boardReference: string;
}

const photoUrl = (id: number) => `/api/files/${id}`;

function describe(p: PlacedPhoto): string {
  return `Board ${p.boardReference}, ${p.photo.originalName ?? `photo ${p.photo.id}`}`;
}

/**
 * The photos of the paper notes that belong to the job, as thumbnails by board. Enter on one opens
 * it large; in the large view ← and → go between the job's photos and Esc closes. Each photo has a
 * choice "Send with the document", off unless someone turned it on; only chosen photos go with the
 * e-mail to the client.
 */
export function JobPhotosPanel({ jobId, role }: JobPhotosPanelProps) {
  const headingId = useId();
  const photos = useJobPhotos(jobId);
  const [open, setOpen] = useState<number | null>(null);
  const mayChoose = role === 'reviewer' || role === 'admin';
  const placed: PlacedPhoto[] = photos.data ? photos.data.boards.flatMap((b) => b.photos.map((photo) => ({ photo, boardReference: b.reference }))) : [];

  return (
    <section aria-labelledby={headingId} className="space-y-3 rounded border border-line bg-surface p-4">
      <h2 id={headingId} className="text-base font-semibold">
        Photos of the notes
      </h2>
      {photos.isPending && <p className="text-muted">Loading the job's photos…</p>}
      {photos.isError && (
        <div role="alert" className="space-y-2 text-danger">
          <p>The job's photos could not be loaded: {photos.error.message}</p>
          <button type="button" className="rounded border border-danger px-2 py-0.5 font-medium" onClick={() => void photos.refetch()}>
            Try again
          </button>
        </div>
      )}
      {photos.isSuccess && placed.length === 0 && <p className="text-muted">No photo of the notes is attached to this job's boards.</p>}
      {photos.isSuccess && placed.length > 0 && (
        <>
          <p className="text-sm text-muted">
            They belong to the job's record. A photo goes to the client only when it is chosen to be sent with the document.
          </p>
          <PhotoBoards boards={photos.data.boards} placed={placed} mayChoose={mayChoose} onOpen={setOpen} />
        </>
      )}
      {open !== null && placed[open] && (
        <LargePhoto placed={placed} index={open} onMove={setOpen} onClose={() => setOpen(null)} mayChoose={mayChoose} />
      )}
    </section>
  );
}

function PhotoBoards({ boards, placed, mayChoose, onOpen }: { boards: JobPhotos['boards']; placed: PlacedPhoto[]; mayChoose: boolean; onOpen: (index: number) => void }) {
  return (
    <div className="space-y-3">
      {boards.map((board) => (
        <div key={board.boardId} role="group" aria-label={`Board ${board.reference}`} className="space-y-1">
          <h3 className="text-sm font-medium">Board {board.reference}</h3>
          <ul className="flex flex-wrap gap-3">
            {board.photos.map((photo) => {
              const index = placed.findIndex((p) => p.photo.id === photo.id);
              const item = placed[index]!;
              return (
                <li key={photo.id} className="w-32 space-y-1">
                  <button
                    type="button"
                    onClick={() => onOpen(index)}
                    aria-label={`Open ${describe(item)}`}
                    className="block h-24 w-32 overflow-hidden rounded border border-line-strong bg-paper focus:outline-2 focus:outline-accent"
                  >
                    <img src={photoUrl(photo.id)} alt="" loading="lazy" className="h-full w-full object-cover" />
                  </button>
                  <SendChoice photo={photo} label={describe(item)} mayChoose={mayChoose} />
                </li>
              );
            })}
          </ul>
        </div>
      ))}
    </div>
  );
}

/** The per-photo choice: a checkbox for a reviewer or an admin, words for everyone else. */
function SendChoice({ photo, label, mayChoose }: { photo: JobPhoto; label: string; mayChoose: boolean }) {
  const choose = useSetPhotoSendChoice();
  const errorId = useId();
  if (!mayChoose) {
    return <p className="text-xs text-muted">{photo.sendToClient ? 'Chosen to send with the document' : 'Not sent to the client'}</p>;
  }
  return (
    <div className="text-xs">
      <label className="flex items-start gap-1">
        <input
          type="checkbox"
          checked={choose.isPending ? (choose.variables?.sendToClient ?? photo.sendToClient) : photo.sendToClient}
          disabled={choose.isPending}
          aria-describedby={choose.isError ? errorId : undefined}
          aria-label={`Send with the document: ${label}`}
          onChange={(event) => choose.mutate({ photoId: photo.id, sendToClient: event.target.checked })}
        />
        <span aria-hidden="true">Send with the document</span>
      </label>
      {choose.isError && (
        <p id={errorId} role="alert" className="text-danger">
          Not changed: {choose.error.message}
        </p>
      )}
    </div>
  );
}

function LargePhoto({ placed, index, onMove, onClose, mayChoose }: { placed: PlacedPhoto[]; index: number; onMove: (index: number) => void; onClose: () => void; mayChoose: boolean }) {
  const current = placed[index]!;
  const figureRef = useRef<HTMLElement>(null);
  // The photo takes the cursor when the view opens, so ← and → work at once (the dialog keeps a
  // focus its content asked for).
  useLayoutEffect(() => figureRef.current?.focus(), []);
  const move = (step: number) => {
    const next = index + step;
    if (next >= 0 && next < placed.length) onMove(next);
  };
  const onKeyDown = (event: ReactKeyboardEvent<HTMLDivElement>) => {
    // The choice's checkbox keeps its own keys; arrows anywhere else move between photos.
    if (event.target instanceof HTMLInputElement) return;
    if (event.key === 'ArrowRight') {
      event.preventDefault();
      move(1);
    } else if (event.key === 'ArrowLeft') {
      event.preventDefault();
      move(-1);
    }
  };
  return (
    <FormDialog title={`Photo ${index + 1} of ${placed.length}: board ${current.boardReference}`} onClose={onClose} wide>
      <div onKeyDown={onKeyDown} className="space-y-2 p-4">
        <figure ref={figureRef} tabIndex={0} aria-label={describe(current)} className="space-y-1 focus:outline-2 focus:outline-accent">
          <img src={photoUrl(current.photo.id)} alt={describe(current)} className="mx-auto max-h-[70vh] max-w-full object-contain" />
          <figcaption className="text-sm text-muted">
            {describe(current)}
            {current.photo.uploadedBy ? ` · attached by ${current.photo.uploadedBy.name}` : ''} · {current.photo.uploadedAt.slice(0, 16).replace('T', ' ')}
          </figcaption>
        </figure>
        <div className="flex items-center gap-3">
          <button type="button" disabled={index === 0} onClick={() => move(-1)} className="rounded border border-line-strong px-2 py-0.5 text-sm disabled:opacity-50">
            Previous <span className="text-muted">(←)</span>
          </button>
          <button type="button" disabled={index === placed.length - 1} onClick={() => move(1)} className="rounded border border-line-strong px-2 py-0.5 text-sm disabled:opacity-50">
            Next <span className="text-muted">(→)</span>
          </button>
          <SendChoice key={current.photo.id} photo={current.photo} label={describe(current)} mayChoose={mayChoose} />
        </div>
      </div>
    </FormDialog>
  );
}
