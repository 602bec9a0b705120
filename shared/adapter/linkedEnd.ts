/**
 * An adapter end that links a published connector sheet: what the end takes from the
 * sheet. The server fills linked ends this way before its check, and the editor does
 * the same when a sheet is linked, so the browser's check and the server's agree.
 */
import type { AdapterEnd } from '../schemas/adapter';
import type { ConnectorContent, ConnectorLayout } from '../schemas/connector';
import { connectorCavityLabels } from '../connector/layout';

/** What an adapter end takes from the connector sheet it links. */
export interface LinkedSheet {
  id: number | string;
  slug: string;
  title: string;
  component: string;
  cavities: string[];
  /** Documented role by cavity label (blank roles left out). */
  roles: Record<string, string>;
  sealed: boolean;
  wireSize: { min?: string; max?: string } | null;
  view: 'mating-face' | 'wire-side' | null;
  housing: 'pin' | 'socket' | null;
  /** The sheet's full layout, labelled positions included, for drawing the end. */
  layout: ConnectorLayout | null;
  /** Wire colour by cavity label on the sheet's own harness. */
  colors: Record<string, string>;
}

/** The linkable facts of a published connector sheet. */
export function linkedSheetOf(
  doc: { id: number | string; slug: string },
  title: string,
  content: ConnectorContent,
): LinkedSheet {
  const roles: Record<string, string> = {};
  const colors: Record<string, string> = {};
  const cavities = connectorCavityLabels(content);
  const known = new Map(cavities.map((c) => [c.toLowerCase(), c]));
  for (const pin of content.pins ?? []) {
    const label = known.get(
      String(pin.cavity ?? '')
        .trim()
        .toLowerCase(),
    );
    if (!label) continue;
    const role = (pin.role ?? '').trim();
    if (role && roles[label] === undefined) roles[label] = role;
    const color = (pin.color ?? '').trim();
    if (color && colors[label] === undefined) colors[label] = color;
  }
  const min = content.wireSize?.min?.trim() || undefined;
  const max = content.wireSize?.max?.trim() || undefined;
  return {
    id: doc.id,
    slug: doc.slug,
    title,
    component: (content.component ?? '').trim(),
    cavities,
    roles,
    sealed: content.sealed === true,
    wireSize: min || max ? { ...(min ? { min } : {}), ...(max ? { max } : {}) } : null,
    view: content.view ? content.view : null,
    housing: content.housing ? content.housing : null,
    layout: content.layout ?? null,
    colors,
  };
}

/**
 * The end as the check sees it once its sheet is linked: the sheet's cavities, roles,
 * sealed flag, wire-size range, view side and grid win over anything typed; the
 * author's own label is kept (the sheet's title when there is none).
 */
export function fillLinkedEnd(end: AdapterEnd, sheet: LinkedSheet): AdapterEnd {
  const filled: AdapterEnd = {
    ...end,
    connectorId: end.connectorId ?? sheet.id,
    label: end.label?.trim() ? end.label : sheet.title,
    cavities: [...sheet.cavities],
    roles: { ...sheet.roles },
    sealed: sheet.sealed,
    wireSize: sheet.wireSize ? { ...sheet.wireSize } : null,
    view: sheet.view ?? end.view ?? null,
    layout:
      sheet.layout?.rows && sheet.layout?.cols
        ? { rows: sheet.layout.rows, cols: sheet.layout.cols }
        : (end.layout ?? null),
  };
  delete filled.cavityCount;
  return filled;
}
