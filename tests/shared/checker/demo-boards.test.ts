/**
 * The demo scenario's planted faults, each found on its circuit with the limit and source the
 * scenario names for it (the scenario states each limit and its source beside the fault).
 */

import { describe, expect, it } from 'vitest';
import { buildDemoScenario, plantedFaults, type DemoBoard, type DemoSite } from '../../../server/db/seed/demo-scenario.ts';
import { checkBoard } from '../../../shared/checker/index.ts';
import type { CheckInput } from '../../../shared/schemas/check.ts';

function toCheckInput(site: DemoSite, board: DemoBoard): { input: CheckInput; idOf: (number: string) => number } {
  const ids = new Map(board.circuits.map((c, i) => [c.number, i + 1]));
  const idOf = (number: string) => ids.get(number)!;
  return {
    idOf,
    input: {
      board: { phases: board.phases, zdbOhm: board.zdbOhm, ipfKa: board.ipfKa, polarityConfirmed: board.polarityConfirmed },
      site: { earthing: site.earthing, nominalVoltageV: site.nominalVoltageV },
      circuits: board.circuits.map(({ spurRingNumber, cells, ...fields }) => ({
        ...fields,
        id: idOf(fields.number),
        spurRingId: spurRingNumber === null ? null : idOf(spurRingNumber),
        cells: Object.fromEntries(Object.entries(cells).map(([key, cell]) => [key, { text: cell!.text, reason: cell!.reason }])),
      })),
    },
  };
}

const boards = buildDemoScenario().sites.flatMap((site) => site.jobs.flatMap((job) => job.boards.map((board) => ({ site, board }))));

function firstNumber(text: string): number {
  return Number(/\d+(?:\.\d+)?/.exec(text)![0]);
}

describe('the demo boards', () => {
  it.each(plantedFaults.map((fault) => [fault.id, fault] as const))('finds the planted fault %s', (_id, fault) => {
    const found = boards.find(({ board }) => board.reference === fault.boardReference);
    expect(found).toBeDefined();
    const { input, idOf } = toCheckInput(found!.site, found!.board);
    const onCircuit = checkBoard(input).filter((f) => f.circuitId === idOf(fault.circuitNumber) && f.columns.some((c) => (fault.columns as readonly string[]).includes(c)));
    if (!fault.expectsFinding) {
      expect(onCircuit.filter((f) => f.code === 'lim-without-reason')).toEqual([]);
      return;
    }
    const finding = onCircuit.find((f) => f.severity !== 'note');
    expect(finding, JSON.stringify(onCircuit)).toBeDefined();
    if (fault.limit !== null) {
      // The same number as the scenario's limit (e.g. 1.37 Ω, 0.28 Ω, 1.0 MΩ).
      expect(firstNumber(finding!.limit!)).toBe(firstNumber(fault.limit));
      const table = /Table \d+(?:\.\d+)?/.exec(fault.source)?.[0];
      if (table) expect(finding!.source).toContain(table);
    }
  });
});
