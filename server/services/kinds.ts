/**
 * What differs between the kinds of document: how content is checked, what the
 * automatic findings are, which cautions a page needs, what the moderator's checklist
 * holds, and what must hold before a revision may be submitted. Everything else (the
 * lifecycle, review, audit, e-mail) is the same for all kinds.
 */
import type { z } from 'zod';
import type { AppContext } from '../context';
import { HttpError } from '../errors';
import { contentSchemaFor, type DocumentKind } from '../../shared/schemas/document';
import type { ConnectorContent } from '../../shared/schemas/connector';
import {
  connectorCautions,
  connectorFindings,
  type CautionKind,
} from '../../shared/connector/findings';
import { connectorCavityLabels } from '../../shared/connector/layout';
import { outlineBody } from '../../shared/writeup/markdown';
import type { CheckReport } from '../../shared/check';
import { checkAdapterContent, type LinkedSheet } from './adapters';
import { writeupCautionsNeeded, writeupServerFindings, writeupSummary } from './writeups';

/** Findings of any kind: errors, warnings and the cautions its page shows. */
export interface DocumentFindings {
  ok: boolean;
  errors: Array<{ code: string; message: string }>;
  warnings: Array<{ code: string; message: string }>;
  cautions: CautionKind[];
  /** Counts of what was checked; shaped by the kind. */
  summary?: unknown;
  /** An adapter's full pin-to-pin check report. */
  report?: CheckReport;
  /** An adapter's ends that link a published connector sheet, as the check read them. */
  linked?: Partial<Record<'A' | 'B', LinkedSheet>>;
}

/** One line of the moderator's checklist; `ok` is null for what only a person can judge. */
export interface ChecklistItem {
  key: string;
  label: string;
  auto: boolean;
  ok: boolean | null;
  detail?: string;
}

type Content = Record<string, unknown>;

export interface KindDefinition {
  /** How the kind is named in sentences: "connector sheet". */
  label: string;
  contentSchema: z.ZodType;
  findings(ctx: AppContext, content: Content): DocumentFindings | Promise<DocumentFindings>;
  cautionsNeeded(content: Content): CautionKind[];
  /** One line for lists and search results when the author wrote no summary. */
  summary(title: string, content: Content): string;
  /** Whether the drawing states its view side, or null when the kind has no drawing. */
  viewStated(content: Content): boolean | null;
}

const text = (v: unknown) => (typeof v === 'string' ? v.trim() : '');

function adapterCautions(
  content: Content,
  linked: Partial<Record<'A' | 'B', LinkedSheet>> = {},
): CautionKind[] {
  const circuits = Array.isArray(content.circuits) ? (content.circuits as Content[]) : [];
  const ends = (content.ends ?? {}) as Record<string, Content | null>;
  return connectorCautions({
    component: [
      ends.A?.label,
      ends.B?.label,
      linked.A?.component,
      linked.B?.component,
      linked.A?.title,
      linked.B?.title,
    ]
      .map(text)
      .join('\n'),
    pins: circuits.map((c) => ({
      cavity: '',
      role: text(c?.role),
      note: [text(c?.note), text(c?.termination)].join(' '),
      size: typeof c?.size === 'string' ? c.size : '',
    })),
  });
}

export const KINDS: Record<DocumentKind, KindDefinition> = {
  connector: {
    label: 'connector sheet',
    contentSchema: contentSchemaFor('connector'),
    findings: (_ctx, content) => connectorFindings(content as ConnectorContent),
    cautionsNeeded: (content) => connectorCautions(content as ConnectorContent),
    summary(_title, content) {
      const c = content as ConnectorContent;
      if (text(c.summary)) return text(c.summary);
      const n = connectorCavityLabels(c).length;
      const parts = [
        n ? `${n}-cavity` : '',
        c.housing ? `${c.housing} housing` : 'connector',
        text(c.component) ? `for the ${text(c.component)}` : '',
        c.sealed ? '(sealed)' : '',
      ].filter(Boolean);
      return parts.join(' ');
    },
    viewStated: (content) => !!(content as ConnectorContent).view,
  },
  adapter: {
    label: 'adapter sheet',
    contentSchema: contentSchemaFor('adapter'),
    // Linked ends are checked against their published sheets (one query for both ends);
    // the findings are the check report: its errors and warnings, and the report itself.
    async findings(ctx, content) {
      const { report, linked } = await checkAdapterContent(ctx, content);
      return { ...report, cautions: adapterCautions(content, linked), report, linked };
    },
    cautionsNeeded: (content) => adapterCautions(content),
    summary(title, content) {
      if (text(content.summary)) return text(content.summary);
      const ends = (content.ends ?? {}) as Record<string, Content | null>;
      const a = text(ends.A?.label);
      const b = text(ends.B?.label);
      return a && b ? `Adapter from the ${a} to the ${b}` : title;
    },
    viewStated(content) {
      const ends = (content.ends ?? {}) as Record<string, Content | null>;
      return ['A', 'B'].every((s) => !!ends[s]?.view || ends[s]?.connectorId != null);
    },
  },
  writeup: {
    label: 'write-up',
    contentSchema: contentSchemaFor('writeup'),
    findings: (ctx, content) => writeupServerFindings(ctx, content),
    cautionsNeeded: writeupCautionsNeeded,
    summary: writeupSummary,
    viewStated: () => null,
  },
};

/** The definition of a kind. */
export function kindOf(kind: DocumentKind): KindDefinition {
  return KINDS[kind];
}

/** Findings for a revision's content, whatever its kind. */
export async function findingsFor(
  ctx: AppContext,
  kind: DocumentKind,
  content: Content,
): Promise<DocumentFindings> {
  return KINDS[kind].findings(ctx, content);
}

/**
 * What must hold before a revision goes to review. An adapter whose pin-to-pin check
 * reports errors cannot be built as written, so it is refused with the report.
 */
export async function submitGate(
  ctx: AppContext,
  kind: DocumentKind,
  content: Content,
): Promise<void> {
  if (kind === 'writeup') {
    const problem = outlineBody(typeof content.body === 'string' ? content.body : '').problem;
    if (problem)
      throw new HttpError(
        422,
        'BODY_TOO_COMPLEX',
        `This write-up cannot be shown as it is. ${problem}`,
      );
    return;
  }
  if (kind !== 'adapter') return;
  const findings = await findingsFor(ctx, kind, content);
  const report = findings.report ?? (findings as unknown as CheckReport);
  if (!report.ok) {
    const n = report.errors.length;
    throw new HttpError(
      422,
      'CHECK_FAILED',
      `The pin-to-pin check found ${n} error${n === 1 ? '' : 's'} in this adapter. Fix ${n === 1 ? 'it' : 'them'} and submit again.`,
      { report },
    );
  }
}

/** The moderator's checklist for a revision: what the server can tell, and what a person must look at. */
export function reviewChecklist(
  kind: DocumentKind,
  content: Content,
  findings: DocumentFindings,
): ChecklistItem[] {
  const def = KINDS[kind];
  const items: ChecklistItem[] = [];
  const e = findings.errors.length;
  const w = findings.warnings.length;
  items.push({
    key: 'checks-clean',
    label: kind === 'writeup' ? 'Automatic checks are clean' : 'The pin table checks clean',
    auto: true,
    ok: e === 0,
    detail:
      e || w
        ? `${e} error${e === 1 ? '' : 's'}, ${w} warning${w === 1 ? '' : 's'}`
        : 'No findings.',
  });
  const view = def.viewStated(content);
  if (view !== null) {
    items.push({
      key: 'view-side',
      label: 'The side each drawing is viewed from is stated',
      auto: true,
      ok: view,
    });
  }
  const cautions = def.cautionsNeeded(content);
  const missing = findings.warnings.filter((f) => f.code === 'CAUTION_MISSING').length;
  items.push({
    key: 'cautions',
    label: 'Cautions are present where fuel, airbag or high-current circuits appear',
    auto: true,
    ok: kind === 'writeup' ? missing === 0 : true,
    detail:
      kind === 'writeup'
        ? missing
          ? `${missing} caution block${missing === 1 ? ' is' : 's are'} missing (see the findings). Read the text too: the check only looks for words.`
          : cautions.length
            ? `The text has caution blocks for: ${cautions.join(', ')}. Read the text too: the check only looks for words.`
            : 'Outside its caution blocks the text mentions no fuel, airbag, battery-feed or high-current work. Read it to be sure.'
        : cautions.length
          ? `The page shows cautions for: ${cautions.join(', ')}.`
          : 'No circuit here needs a special caution.',
  });
  items.push({
    key: 'images-clean',
    label: 'Images are free of faces, number plates and addresses',
    auto: false,
    ok: null,
  });
  items.push({
    key: 'original',
    label: 'Nothing is copied from service manuals, catalogues or other sites',
    auto: false,
    ok: null,
  });
  return items;
}
