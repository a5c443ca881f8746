import type { Circuit } from '../../shared/schemas/boards.ts';
import type { Finding } from '../../shared/schemas/findings.ts';
import { fitCircuit } from '../../shared/schemas/fit-circuit.ts';

/** Findings about stored values that had to be fitted, kept beside the circuit served. */
const unfitFindings = new WeakMap<Circuit, Finding[]>();

/** The circuit as it may be served (fits its schema); what did not fit is remembered as findings. */
export function servedCircuit(circuit: Circuit): Circuit {
  const fitted = fitCircuit(circuit);
  if (fitted.findings.length > 0) unfitFindings.set(fitted.circuit, fitted.findings);
  return fitted.circuit;
}

/** The "stored value does not fit" findings of circuits loaded through `servedCircuit`. */
export function storedValueFindings(circuits: readonly Circuit[]): Finding[] {
  const found: Finding[] = [];
  for (const circuit of circuits) {
    const list = unfitFindings.get(circuit);
    if (list) found.push(...list);
  }
  return found;
}

/** The same circuit at another position (findings about its stored values carried along). */
export function withPosition(circuit: Circuit, position: number): Circuit {
  const moved = { ...circuit, position };
  const findings = unfitFindings.get(circuit);
  if (findings) unfitFindings.set(moved, findings);
  return moved;
}
