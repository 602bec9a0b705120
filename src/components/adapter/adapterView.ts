/** What the adapter's reading views (public page, build sheet, review preview) share. */
import type { AdapterInput, CheckReport } from '@shared/schemas/adapter';
import { checkAdapter } from '@shared/check';
import type { LinkedSheet } from '@shared/adapter/linkedEnd';
import type { CautionKind } from '@/components/cautions';
import { readAdapterContent, type Side } from './adapterContent';

export interface AdapterViewData {
  content: AdapterInput;
  report: CheckReport;
  linked: Partial<Record<Side, LinkedSheet>>;
  cautions: CautionKind[];
}

/** Cautions every build sheet carries: fuse new feeds, battery off, hands off airbag circuits. */
const ALWAYS: CautionKind[] = ['battery', 'high-current', 'airbag'];
const ORDER: CautionKind[] = ['airbag', 'fuel', 'battery', 'high-current', 'heat'];

function isReport(v: unknown): v is CheckReport {
  return (
    !!v &&
    typeof v === 'object' &&
    Array.isArray((v as CheckReport).errors) &&
    !!(v as CheckReport).summary?.ends
  );
}

/**
 * The adapter of a document view: its content, the server's check report when the view
 * carries one (linked ends resolved against their sheets), otherwise the browser's own
 * check, the linked sheets and the cautions to show.
 */
export function adapterViewData(content: unknown, findings: unknown): AdapterViewData {
  const read = readAdapterContent(content);
  const input: AdapterInput = {
    systemVoltage: read.systemVoltage,
    ends: read.ends,
    circuits: read.circuits,
  };
  const f = (findings ?? {}) as { report?: unknown; linked?: unknown; cautions?: unknown };
  const report = isReport(f.report) ? f.report : checkAdapter(input);
  const linked = (
    f.linked && typeof f.linked === 'object' ? f.linked : {}
  ) as AdapterViewData['linked'];
  const named = Array.isArray(f.cautions)
    ? (f.cautions.filter((c) => typeof c === 'string') as CautionKind[])
    : [];
  const wanted = new Set<CautionKind>([...ALWAYS, ...named]);
  return { content: input, report, linked, cautions: ORDER.filter((k) => wanted.has(k)) };
}
