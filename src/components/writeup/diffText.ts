/** Write-up fields in words for the review diff, instead of their stored JSON. */
import type { PartsList, SpecValue, WireRun, WriteupImage } from '@shared/schemas/writeup';
import { JOIN_LABELS } from '@shared/schemas/writeup';
import { formatRange, itemRange } from '@shared/writeup/parts';
import { formatSi } from '@shared/writeup/units';

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

function images(list: WriteupImage[]): string {
  if (!list.length) return '(none)';
  return list
    .map((img, i) => {
      const kinds = new Map<string, number>();
      for (const a of img.annotations ?? []) kinds.set(a.type, (kinds.get(a.type) ?? 0) + 1);
      const marks = [...kinds].map(([t, n]) => plural(n, t === 'box' ? 'box' : t)).join(', ');
      return `Image ${i + 1}${img.caption ? ` “${img.caption}”` : ''}: ${marks || 'no markings'}`;
    })
    .join('; ');
}

function wireRun(run: WireRun): string {
  const wires = run.wires ?? [];
  const rows = wires.map(
    (w, i) =>
      `${i + 1}. ${w.color || '?'} ${w.size || '?'} ${w.role || ''} +${w.addedLengthMm} mm, ${JOIN_LABELS[w.join] ?? w.join}`,
  );
  return `${plural(wires.length, 'wire')}${run.systemVoltage ? ` at ${run.systemVoltage} V` : ''}${rows.length ? `: ${rows.join('; ')}` : ''}`;
}

function parts(p: PartsList): string {
  const options = (p.options ?? []).map((o) => o.name || o.id);
  const items = (p.items ?? []).map(
    (it) => `${it.name || '?'} ×${it.quantity} ${formatRange(itemRange(it), p.currency)}`,
  );
  return `${options.length ? `${plural(options.length, 'option')} (${options.join(', ')}); ` : ''}${plural(items.length, 'part')}${items.length ? `: ${items.join('; ')}` : ''}`;
}

function specs(list: SpecValue[]): string {
  return list.length
    ? list
        .map((s) => `${s.label || s.quantity}: ${formatSi(s.quantity, s.value, 'metric')}`)
        .join('; ')
    : '(none)';
}

/** The words for a write-up field's value, or null when the field is not one of these. */
export function writeupFieldText(field: string, value: unknown): string | null {
  try {
    if (field === 'images' && Array.isArray(value)) return images(value as WriteupImage[]);
    if (field === 'wireRun' && value && typeof value === 'object') return wireRun(value as WireRun);
    if (field === 'parts' && value && typeof value === 'object') return parts(value as PartsList);
    if (field === 'specs' && Array.isArray(value)) return specs(value as SpecValue[]);
  } catch {
    return null;
  }
  return null;
}
