/** Element ids and keys the console's parts share (grid cells, their finding texts, row headers). */

export function cellKey(circuitId: number, column: string): string {
  return `${circuitId}:${column}`;
}

export function cellDomId(circuitId: number, column: string): string {
  return `bw-cell-${circuitId}-${column}`;
}

/** The element holding the text of a cell's findings (`column` '' for the circuit as a whole). */
export function cellFindingDomId(circuitId: number, column: string): string {
  return `bw-finding-${circuitId}-${column || 'circuit'}`;
}

/** The element holding the message of text refused at a cell. */
export function cellErrorDomId(circuitId: number, column: string): string {
  return `bw-refused-${circuitId}-${column}`;
}

export function rowHeaderDomId(circuitId: number): string {
  return `bw-circuit-${circuitId}`;
}
