import type { SaveStatus } from '../sync/types.ts';

/** The save state in words with its symbol (never colour alone), and a tone for its colour. */
export function describeSaveStatus(status: SaveStatus): { symbol: string; text: string; tone: 'ok' | 'busy' | 'bad' } {
  switch (status.state) {
    case 'saved':
      return { symbol: '✓', text: 'saved', tone: 'ok' };
    case 'saving':
      return { symbol: '↻', text: status.waiting > 1 ? `saving… ${status.waiting} waiting` : 'saving…', tone: 'busy' };
    case 'offline':
      return { symbol: '⚠', text: `offline — ${status.waiting} waiting`, tone: 'bad' };
    case 'error':
      return { symbol: '✕', text: `not saving: ${status.message}`, tone: 'bad' };
  }
}

export const saveToneClass = { ok: 'text-ok', busy: 'text-muted', bad: 'text-danger font-semibold' } as const;
