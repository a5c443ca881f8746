import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState, type ClipboardEvent, type KeyboardEvent, type RefObject } from 'react';
import { attachPhoto, boardPhotosQueryOptions } from '../import/api/import-api.ts';

const widthKey = 'boardwalk.photo-panel.width';
const minWidth = 240;
const maxWidth = 1200;

function rememberedWidth(): number {
  try {
    const n = Number(localStorage.getItem(widthKey));
    return Number.isFinite(n) && n >= minWidth && n <= maxWidth ? n : 420;
  } catch {
    return 420;
  }
}

export interface PhotoPanelProps {
  boardId: number;
  /** Why nothing may be attached now (a locked board); null when photos may be attached. */
  lockedReason: string | null;
  panelRef: RefObject<HTMLDivElement | null>;
  /** Esc: back to the grid (the panel stays shown). */
  onLeave: () => void;
}

interface View {
  zoom: number;
  x: number;
  y: number;
  rotation: number;
}
const start: View = { zoom: 1, x: 0, y: 0, rotation: 0 };

/** The panel's keys, for its own help line and the keys overlay's words. */
export const photoPanelKeys = [
  ['+ / −', 'zoom in / out'],
  ['arrows', 'move the photo (Shift: further)'],
  ['r / Shift+R', 'rotate a quarter turn right / left'],
  ['0', 'fit again'],
  ['PageUp / PageDown', 'previous / next photo'],
  ['[ / ]', 'narrower / wider panel (remembered)'],
  ['a', 'attach a photo'],
  ['Esc', 'back to the grid'],
] as const;

/**
 * Photos of the paper notes beside the grid. It keeps its zoom, position and rotation while the
 * typist moves through the grid (its state is its own, not the grid's), and its width between
 * visits. Keys work when it has the focus (the "Show photos of the notes" command gives it); Esc
 * gives the focus back to the grid. A pasted image is attached.
 */
export function PhotoPanel({ boardId, lockedReason, panelRef, onLeave }: PhotoPanelProps) {
  const queryClient = useQueryClient();
  const photos = useQuery(boardPhotosQueryOptions(boardId));
  const [index, setIndex] = useState(0);
  const [view, setView] = useState<View>(start);
  const [width, setWidth] = useState(rememberedWidth);
  const [note, setNote] = useState<{ text: string; error: boolean } | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const fileRef = useRef<HTMLInputElement>(null);

  const list = photos.data?.photos ?? [];
  const photo = list[Math.min(index, list.length - 1)];

  useEffect(() => {
    try {
      localStorage.setItem(widthKey, String(width));
    } catch {
      // Private windows may refuse storage: the width is then only kept for this visit.
    }
  }, [width]);

  const attach = async (file: File | undefined) => {
    if (!file) return;
    if (lockedReason) {
      setNote({ text: lockedReason, error: true });
      return;
    }
    setProgress(0);
    try {
      const { photo: added } = await attachPhoto(boardId, file, setProgress);
      await queryClient.invalidateQueries({ queryKey: boardPhotosQueryOptions(boardId).queryKey });
      const fresh = queryClient.getQueryData(boardPhotosQueryOptions(boardId).queryKey);
      setIndex(Math.max(0, (fresh?.photos.findIndex((p) => p.id === added.id) ?? 0)));
      setView(start);
      setNote({ text: `Attached. ${added.locationNote ?? ''}`, error: false });
    } catch (error) {
      setNote({ text: error instanceof Error ? error.message : 'The photo was not attached.', error: true });
    } finally {
      setProgress(null);
      panelRef.current?.focus();
    }
  };

  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    if (event.target !== event.currentTarget || event.nativeEvent.isComposing) return;
    if (event.ctrlKey || event.metaKey || event.altKey) return;
    const step = event.shiftKey ? 120 : 40;
    const handled = (() => {
      switch (event.key) {
        case '+':
        case '=':
          setView((v) => ({ ...v, zoom: Math.min(8, v.zoom * 1.25) }));
          return true;
        case '-':
        case '_':
          setView((v) => ({ ...v, zoom: Math.max(0.25, v.zoom / 1.25) }));
          return true;
        case 'ArrowLeft':
          setView((v) => ({ ...v, x: v.x + step }));
          return true;
        case 'ArrowRight':
          setView((v) => ({ ...v, x: v.x - step }));
          return true;
        case 'ArrowUp':
          setView((v) => ({ ...v, y: v.y + step }));
          return true;
        case 'ArrowDown':
          setView((v) => ({ ...v, y: v.y - step }));
          return true;
        case 'r':
          setView((v) => ({ ...v, rotation: (v.rotation + 90) % 360 }));
          return true;
        case 'R':
          setView((v) => ({ ...v, rotation: (v.rotation + 270) % 360 }));
          return true;
        case '0':
          setView(start);
          return true;
        case 'PageUp':
          setIndex((i) => Math.max(0, i - 1));
          setView(start);
          return true;
        case 'PageDown':
          setIndex((i) => Math.min(Math.max(0, list.length - 1), i + 1));
          setView(start);
          return true;
        case '[':
          setWidth((w) => Math.max(minWidth, w - 40));
          return true;
        case ']':
          setWidth((w) => Math.min(maxWidth, w + 40));
          return true;
        case 'a':
          fileRef.current?.click();
          return true;
        case 'Escape':
          onLeave();
          return true;
        default:
          return false;
      }
    })();
    if (handled) {
      event.preventDefault();
      event.stopPropagation();
    }
  };

  const onPaste = (event: ClipboardEvent<HTMLDivElement>) => {
    const file = [...event.clipboardData.files].find((f) => f.type.startsWith('image/'));
    if (file) {
      event.preventDefault();
      void attach(file);
    }
  };

  return (
    <aside aria-label="Photos of the paper notes" className="flex min-h-0 shrink-0 flex-col border-l border-line bg-paper" style={{ width }}>
      <div className="flex items-center gap-2 border-b border-line px-2 py-1 text-sm">
        <span className="font-medium">Notes</span>
        <span className="text-muted" aria-live="polite">
          {photo ? `photo ${Math.min(index, list.length - 1) + 1} of ${list.length} · ${Math.round(view.zoom * 100)}% · ${view.rotation}°` : photos.isLoading ? 'loading…' : 'no photo yet'}
        </span>
        <button type="button" onClick={() => fileRef.current?.click()} className="ml-auto rounded border border-line-strong px-2 py-0.5" disabled={lockedReason !== null}>
          Attach a photo
        </button>
        <input
          ref={fileRef}
          type="file"
          accept="image/jpeg,image/png,image/heic"
          className="hidden"
          aria-label="Photo of the notes (JPEG or PNG)"
          data-photo-input
          onChange={(e) => {
            void attach(e.currentTarget.files?.[0]);
            e.currentTarget.value = '';
          }}
        />
      </div>
      <div
        ref={panelRef}
        tabIndex={0}
        role="img"
        aria-roledescription="photo viewer"
        aria-label={photo ? `Photo of the notes: ${photo.originalName ?? 'unnamed'}, zoom ${Math.round(view.zoom * 100)}%, turned ${view.rotation}°` : 'No photo of the notes yet; press a to attach one, or paste an image'}
        aria-describedby="photo-panel-keys"
        onKeyDown={onKeyDown}
        onPaste={onPaste}
        className="relative min-h-0 flex-1 overflow-hidden bg-ink/5 focus:outline-2 focus:outline-accent"
      >
        {photo ? (
          <img
            src={`/api/files/${photo.id}`}
            alt=""
            draggable={false}
            data-photo-view
            data-zoom={view.zoom}
            data-x={view.x}
            data-y={view.y}
            data-rotation={view.rotation}
            className="absolute left-0 top-0 max-w-full origin-center select-none"
            style={{ transform: `translate(${view.x}px, ${view.y}px) scale(${view.zoom}) rotate(${view.rotation}deg)` }}
          />
        ) : (
          <p className="p-3 text-sm text-muted">Attach a photo of the paper notes (a, or the button), or paste one here.</p>
        )}
      </div>
      {progress !== null && <progress className="w-full" max={1} value={progress} aria-label="Attaching the photo" />}
      {note && (
        <p role={note.error ? 'alert' : 'status'} className={`px-2 py-1 text-xs ${note.error ? 'text-error' : 'text-muted'}`}>
          {note.text}
        </p>
      )}
      <p id="photo-panel-keys" className="border-t border-line px-2 py-1 text-xs text-muted">
        {photoPanelKeys.map(([k, w]) => `${k} ${w}`).join(' · ')}. Photos stay with the job’s record; they are not sent to the client.
      </p>
    </aside>
  );
}
