/**
 * Where each cavity of a connector sits in its drawing, and the mirror between the two
 * sides a connector is drawn from.
 *
 * A drawing is a grid of rows × cols cells seen from one side. Looking at the mating
 * face and turning the connector round to look at the wire side is a left-right flip:
 * the cavity in column c appears in column cols − 1 − c, rows stay where they are.
 * Mirroring twice gives the original drawing.
 */
import type { ConnectorContent, ConnectorView } from '../schemas/connector';
import { MAX_CONNECTOR_CAVITIES } from '../schemas/connector';
import { customLabels, letterLabels, numericLabels } from '../wire/cavities';

/** One cavity in a drawing: 0-based row (top first) and column (left first). */
export interface CavityPosition {
  label: string;
  row: number;
  col: number;
}

/** A drawing of the cavities as seen from `view` (null when the sheet does not say). */
export interface CavityLayout {
  rows: number;
  cols: number;
  view: ConnectorView | null;
  cells: CavityPosition[];
  /** Labels that have no cell (a positions list that leaves them out). */
  unplaced: string[];
}

/** Columns used when a sheet gives no layout: one row up to this many cavities. */
const DEFAULT_COLS = 8;

/**
 * The cavity labels of a sheet: its `cavities` list when it names any (trimmed, blanks
 * and repeats dropped), otherwise `cavityCount` labels in the sheet's scheme ("1".."n",
 * or "A".. without I, O, Q for `labels: 'alpha'`).
 */
export function connectorCavityLabels(
  content: Pick<ConnectorContent, 'cavities' | 'cavityCount' | 'labels'>,
): string[] {
  if (Array.isArray(content.cavities)) {
    const listed = customLabels(content.cavities).slice(0, MAX_CONNECTOR_CAVITIES);
    if (listed.length) return listed;
  }
  const n = Math.min(MAX_CONNECTOR_CAVITIES, Math.max(0, Math.floor(content.cavityCount ?? 0)));
  return content.labels === 'alpha' ? letterLabels(n) : numericLabels(n);
}

/** The other side: mating-face ↔ wire-side. */
export function otherView(view: ConnectorView): ConnectorView {
  return view === 'mating-face' ? 'wire-side' : 'mating-face';
}

/**
 * Lays a sheet's cavities out as the sheet documents them. With `layout.positions`
 * each listed label takes its cell; otherwise labels fill rows × cols row by row, left
 * to right, and the grid grows by rows when it is too small for the labels. Without a
 * layout the labels sit in rows of up to eight.
 */
export function layoutCavities(
  content: Pick<ConnectorContent, 'cavities' | 'cavityCount' | 'labels' | 'layout' | 'view'>,
): CavityLayout {
  const labels = connectorCavityLabels(content);
  const view = content.view ? content.view : null;
  const positions = content.layout?.positions;
  if (positions && positions.length) {
    const known = new Map(labels.map((l) => [l.toLowerCase(), l]));
    const cells: CavityPosition[] = [];
    const taken = new Set<string>();
    const placed = new Set<string>();
    for (const p of positions) {
      const label = known.get(p.label.trim().toLowerCase());
      const cell = `${p.row},${p.col}`;
      // Unknown labels and a second cavity in one cell are findings; the drawing skips them.
      if (!label || placed.has(label) || taken.has(cell)) continue;
      placed.add(label);
      taken.add(cell);
      cells.push({ label, row: p.row, col: p.col });
    }
    const rows = Math.max(content.layout?.rows ?? 0, ...cells.map((c) => c.row + 1), 1);
    const cols = Math.max(content.layout?.cols ?? 0, ...cells.map((c) => c.col + 1), 1);
    return { rows, cols, view, cells, unplaced: labels.filter((l) => !placed.has(l)) };
  }
  const cols = Math.max(
    1,
    content.layout?.cols ?? Math.min(DEFAULT_COLS, Math.max(labels.length, 1)),
  );
  const rows = Math.max(content.layout?.rows ?? 1, Math.ceil(labels.length / cols), 1);
  const cells = labels.map((label, i) => ({ label, row: Math.floor(i / cols), col: i % cols }));
  return { rows, cols, view, cells, unplaced: [] };
}

/** A cell seen from the other side: same row, column cols − 1 − col. */
export function mirrorPosition(pos: CavityPosition, cols: number): CavityPosition {
  return { ...pos, col: cols - 1 - pos.col };
}

/** The same drawing seen from the other side of the connector. */
export function mirrorLayout(layout: CavityLayout): CavityLayout {
  return {
    ...layout,
    view: layout.view ? otherView(layout.view) : null,
    cells: layout.cells.map((c) => mirrorPosition(c, layout.cols)),
  };
}

/**
 * The drawing seen from `view`: as documented when the sheet is drawn from that side
 * (or does not say), mirrored when it is drawn from the other one.
 */
export function layoutFromView(layout: CavityLayout, view: ConnectorView): CavityLayout {
  if (!layout.view || layout.view === view) return { ...layout, view: layout.view ?? null };
  return mirrorLayout(layout);
}

/** The label at each cell, rows top to bottom, '' for an empty cell: handy for tests and text output. */
export function layoutGrid(layout: CavityLayout): string[][] {
  const grid = Array.from({ length: layout.rows }, () => Array<string>(layout.cols).fill(''));
  for (const c of layout.cells)
    if (grid[c.row] && c.col < layout.cols) grid[c.row][c.col] = c.label;
  return grid;
}
