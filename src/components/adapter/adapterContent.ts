/** Content of adapter sheets as the client holds it: blank content and safe reading. */
import type { AdapterEnd, AdapterInput, CircuitInput } from '@shared/schemas/adapter';
import { isWellFormedAdapterInput, parseAdapterCheckInput } from '@shared/schemas/adapter';

export type Side = 'A' | 'B';

/** A blank adapter sheet: two ends still to be linked or described, no circuits. */
export function emptyAdapterContent(): AdapterInput {
  return { systemVoltage: 12, ends: { A: {}, B: {} }, circuits: [] };
}

/** Stored content read as an adapter (anything unreadable becomes blank). */
export function readAdapterContent(raw: unknown): {
  systemVoltage: number;
  ends: Record<Side, AdapterEnd>;
  circuits: CircuitInput[];
} {
  let input: AdapterInput = emptyAdapterContent();
  if (isWellFormedAdapterInput(raw)) input = raw;
  else {
    const parsed = parseAdapterCheckInput(raw);
    if (parsed.ok) input = parsed.data;
  }
  return {
    systemVoltage: input.systemVoltage ?? 12,
    ends: { A: { ...(input.ends?.A ?? {}) }, B: { ...(input.ends?.B ?? {}) } },
    circuits: input.circuits ?? [],
  };
}
