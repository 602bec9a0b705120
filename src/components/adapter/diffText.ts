/** Adapter fields in words for the review diff, instead of their stored JSON. */
import type { AdapterEnd } from '@shared/schemas/adapter';
import { endCavityLabels } from '@shared/wire/cavities';
import { viewWords } from '@/components/connector/pinMapModel';

function endText(side: string, end: AdapterEnd | null | undefined): string {
  if (!end) return `End ${side}: not described`;
  const n = endCavityLabels({
    cavities: end.cavities ?? null,
    cavityCount: end.cavityCount ?? null,
  }).length;
  const parts = [
    end.connectorId != null ? `linked sheet ${end.connectorId}` : 'described here',
    `${n} ${n === 1 ? 'cavity' : 'cavities'}`,
    end.sealed ? 'sealed' : 'unsealed',
    `viewed from ${viewWords(end.view ?? null)}`,
  ];
  if (end.wireSize?.min || end.wireSize?.max)
    parts.push(`wire ${end.wireSize?.min || '…'} to ${end.wireSize?.max || '…'}`);
  if (end.layout?.rows && end.layout?.cols) parts.push(`${end.layout.rows} × ${end.layout.cols}`);
  const label = (end.label ?? '').trim();
  return `End ${side}${label ? ` “${label}”` : ''}: ${parts.join(', ')}`;
}

/** Words for an adapter field (`ends`, `systemVoltage`), or null for any other field. */
export function adapterFieldText(field: string, value: unknown): string | null {
  if (field === 'systemVoltage' && typeof value === 'number') return `${value} V`;
  if (field === 'ends' && value && typeof value === 'object' && !Array.isArray(value)) {
    const ends = value as Record<string, AdapterEnd | null | undefined>;
    return [endText('A', ends.A), endText('B', ends.B)].join('; ');
  }
  return null;
}

/** Column and field names of adapter content as the diff heads them. */
export const ADAPTER_FIELD_LABELS: Record<string, string> = {
  ends: 'Ends',
  systemVoltage: 'System voltage',
  a: 'End A cavities',
  b: 'End B cavities',
  lengthMm: 'Length (mm)',
  currentA: 'Current (A)',
  termination: 'Termination',
};
