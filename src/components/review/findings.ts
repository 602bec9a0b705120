/** The automatic findings of any kind, read into one list for display. */
export interface ShownFinding {
  severity: 'error' | 'warning' | 'info';
  message: string;
  code?: string;
}

function one(raw: unknown, fallback: ShownFinding['severity']): ShownFinding | null {
  if (!raw || typeof raw !== 'object')
    return typeof raw === 'string' ? { severity: fallback, message: raw } : null;
  const r = raw as Record<string, unknown>;
  const message = typeof r.message === 'string' ? r.message : null;
  if (!message) return null;
  const sev =
    r.severity === 'error' || r.severity === 'warning' || r.severity === 'info'
      ? r.severity
      : fallback;
  return { severity: sev, message, code: typeof r.code === 'string' ? r.code : undefined };
}

/**
 * Accepts the shapes the kinds report in: a list of findings, `{errors, warnings}`
 * (connector sheets), or a check report `{findings: [...]}`/`{report: …}` (adapters).
 */
export function normaliseFindings(raw: unknown): ShownFinding[] {
  if (!raw) return [];
  if (Array.isArray(raw))
    return raw.map((f) => one(f, 'warning')).filter((f): f is ShownFinding => !!f);
  if (typeof raw !== 'object') return [];
  const r = raw as Record<string, unknown>;
  const out: ShownFinding[] = [];
  if (Array.isArray(r.errors))
    out.push(...r.errors.map((f) => one(f, 'error')).filter((f): f is ShownFinding => !!f));
  if (Array.isArray(r.warnings))
    out.push(...r.warnings.map((f) => one(f, 'warning')).filter((f): f is ShownFinding => !!f));
  if (Array.isArray(r.findings)) out.push(...normaliseFindings(r.findings));
  // An adapter's findings carry its check report too: read it only when the errors and
  // warnings are not already listed beside it, so nothing shows twice.
  if (r.report && !Array.isArray(r.errors) && !Array.isArray(r.warnings))
    out.push(...normaliseFindings(r.report));
  const order = { error: 0, warning: 1, info: 2 };
  return out.sort((a, b) => order[a.severity] - order[b.severity]);
}

/** Cautions named by a kind's findings (`cautions: ['battery', …]`), when it reports them. */
export function findingCautions(raw: unknown): string[] {
  if (!raw || typeof raw !== 'object' || Array.isArray(raw)) return [];
  const c = (raw as Record<string, unknown>).cautions;
  return Array.isArray(c) ? c.filter((x): x is string => typeof x === 'string') : [];
}
