import { describe, expect, it } from 'vitest';
import type { BoardChanges, BoardDetail, Cell, Circuit } from '../../../../shared/schemas/boards.ts';
import { mergeChanges, mergeCircuit, mergeFetched } from '../../../../src/features/board-console/sync/merge.ts';
import { cellTarget, fieldTarget } from '../../../../src/features/board-console/sync/targets.ts';

const tess = { id: 2, name: 'Tess Second' };

function cell(text: string, version: number, by = tess): Cell {
  return { text, reason: null, version, updatedBy: by, updatedAt: `2026-12-02T10:00:0${version}.000Z` };
}

function circuit(id: number, overrides: Partial<Circuit> = {}): Circuit {
  return {
    id, boardId: 1, position: id, version: 1, number: String(id), phase: null, description: `Circuit ${id}`, kind: 'radial',
    wiringType: 'A', referenceMethod: 'C', points: 4, liveCsaMm2: 1.5, cpcCsaMm2: 1, maxDisconnectionS: 0.4, deviceStandard: '60898',
    deviceType: 'B', ratingA: 6, breakingKa: 6, rcdType: 'A', rcdRatedResidualMa: 30, afdd: null, remarks: '', spurRingId: null,
    spurOriginPoint: null, spurLengthM: null, maxZsByHandOhm: null, cells: {}, ...overrides,
  };
}

function board(circuits: Circuit[], cursor = 10): BoardDetail {
  return {
    board: { id: 1, jobId: 1, reference: 'DB1', location: '', suppliedFrom: '', phases: 1, zdbOhm: 0.2, ipfKa: 1.5, polarityConfirmed: false, phaseSequenceConfirmed: false, instruments: '', state: 'open', lockedBy: null, lockedAt: null, version: 1 },
    site: { id: 1, client: 'Client', address: '1 Row', description: '', earthing: 'TN-C-S', nominalVoltageV: 230, zeOhm: 0.2, pfcKa: 1.6 } as BoardDetail['site'],
    job: { id: 1, siteId: 1, kind: 'EICR', reference: 'T-1', visitDate: '2026-12-01', limitations: '' } as BoardDetail['job'],
    circuits,
    findings: [],
    cursor,
  };
}

function changes(cached: BoardDetail, circuits: Circuit[], order: number[], cursor: number): BoardChanges {
  return { cursor, board: cached.board, circuits, order, findings: [], present: [] };
}

describe('mergeCircuit', () => {
  it('when the server sends the same circuit, then the cached object is kept', () => {
    const cached = circuit(1, { cells: { zs: cell('0.4', 1) } });
    const incoming = structuredClone(cached);
    expect(mergeCircuit(cached, incoming, new Set())).toBe(cached);
  });

  it('when a cell is newer on the server, then it is taken and the other cells keep their objects', () => {
    const zs = cell('0.4', 1);
    const cached = circuit(1, { cells: { zs, r1PlusR2: cell('0.3', 1) } });
    const incoming = circuit(1, { cells: { zs: cell('0.4', 1), r1PlusR2: cell('0.35', 2) } });
    const merged = mergeCircuit(cached, incoming, new Set());
    expect(merged.cells.r1PlusR2?.text).toBe('0.35');
    expect(merged.cells.zs).toBe(zs);
  });

  it('when the server answer is older than the cache (a poll that left before our save landed), then nothing goes back', () => {
    const cached = circuit(1, { version: 3, description: 'Cooker', cells: { zs: cell('0.5', 2) } });
    const incoming = circuit(1, { version: 2, description: 'Old name', cells: { zs: cell('0.4', 1) } });
    expect(mergeCircuit(cached, incoming, new Set())).toBe(cached);
  });

  it('when a cell or detail has a pending edit, then the server value does not replace the cached one', () => {
    const cached = circuit(1, { cells: { zs: cell('0.4', 1) } });
    const incoming = circuit(1, { version: 2, description: 'Hall', points: 9, cells: { zs: cell('0.9', 2) } });
    const merged = mergeCircuit(cached, incoming, new Set([cellTarget(1, 'zs'), fieldTarget(1, 'description')]));
    expect(merged.cells.zs?.text).toBe('0.4');
    expect(merged.description).toBe('Circuit 1');
    expect(merged.points).toBe(9);
    expect(merged.version).toBe(2);
  });
});

describe('mergeChanges', () => {
  it('when one circuit changed, then only that circuit is a new object', () => {
    const cached = board([circuit(1), circuit(2), circuit(3)]);
    const { detail, missing } = mergeChanges(cached, changes(cached, [circuit(2, { version: 2, remarks: 'Tripped once' })], [1, 2, 3], 11), {
      after: 10, pending: new Set(), applyOrder: true,
    });
    expect(missing).toBe(false);
    expect(detail.circuits[0]).toBe(cached.circuits[0]);
    expect(detail.circuits[1]?.remarks).toBe('Tripped once');
    expect(detail.circuits[2]).toBe(cached.circuits[2]);
    expect(detail.cursor).toBe(11);
  });

  it('when nothing changed, then the cached board itself is returned', () => {
    const cached = board([circuit(1), circuit(2)]);
    expect(mergeChanges(cached, changes(cached, [], [1, 2], 10), { after: 10, pending: new Set(), applyOrder: true }).detail).toBe(cached);
  });

  it('when circuits were inserted, removed and moved, then the order follows and positions are renumbered', () => {
    const cached = board([circuit(1), circuit(2), circuit(3)]);
    const { detail } = mergeChanges(cached, changes(cached, [circuit(4, { position: 2 })], [1, 4, 3], 12), { after: 10, pending: new Set(), applyOrder: true });
    expect(detail.circuits.map((c) => [c.id, c.position])).toEqual([[1, 1], [4, 2], [3, 3]]);
    expect(detail.circuits[0]).toBe(cached.circuits[0]);
  });

  it('when the order is not to be applied, then the cached order stays and unknown circuits are ignored', () => {
    const cached = board([circuit(1), circuit(2)]);
    const { detail } = mergeChanges(cached, changes(cached, [circuit(9)], [1], 12), { after: 10, pending: new Set(), applyOrder: false });
    expect(detail.circuits.map((c) => c.id)).toEqual([1, 2]);
  });

  it('when the order names a circuit nobody sent, then the merge says the board must be read again', () => {
    const cached = board([circuit(1)]);
    expect(mergeChanges(cached, changes(cached, [], [1, 7], 12), { after: 10, pending: new Set(), applyOrder: true }).missing).toBe(true);
  });
});

describe('mergeFetched', () => {
  it('when a fetched board is older for one cell, then the newer cached cell stays and the rest is taken', () => {
    const cached = board([circuit(1, { cells: { zs: cell('0.5', 2) } }), circuit(2)], 12);
    const fetched = board([circuit(1, { cells: { zs: cell('0.4', 1) } })], 11);
    const merged = mergeFetched(cached, fetched, new Set());
    expect(merged.circuits.map((c) => c.id)).toEqual([1]);
    expect(merged.circuits[0]?.cells.zs?.text).toBe('0.5');
    expect(merged.cursor).toBe(11);
  });
});
