/**
 * Findings of a write-up that need nothing but its content: the caution check, image
 * references and captions, wire-run sizes, colours and voltage drop, parts-list prices.
 * The editor shows them while the author types; the server adds what only it can check
 * (the uploads exist, linked sheets are published) and shows the lot to the moderator.
 */
import type { WriteupContent } from '../schemas/writeup';
import { outlineBody, type BodyOutline } from './markdown';
import { cautionFindings, cautionMentions, type CheckedCautionKind } from './cautions';
import { wireRunTotals } from './wireRun';
import { partsTotals } from './parts';

export interface WriteupFinding {
  code: string;
  severity: 'error' | 'warning';
  message: string;
  field?: string;
  /** Row of the wire run or the parts list. */
  row?: number;
  /** 0-based index of the image. */
  image?: number;
  line?: number;
  kind?: string;
}

export interface WriteupFindings {
  ok: boolean;
  errors: WriteupFinding[];
  warnings: WriteupFinding[];
  /** Cautions the page needs: the kinds the text or the wire run mentions. */
  cautions: CheckedCautionKind[];
  summary: {
    images: number;
    markings: number;
    placedImages: number;
    wires: number;
    splices: number;
    partOptions: number;
    cautionBlocks: number;
  };
}

const rowName = (i: number) => `row ${i + 1}`;

/** The write-up's own findings, from its content alone. */
export function writeupFindings(
  content: Partial<WriteupContent>,
  outline: BodyOutline = outlineBody(content.body ?? ''),
): WriteupFindings {
  const errors: WriteupFinding[] = [];
  const warnings: WriteupFinding[] = [];
  const images = content.images ?? [];

  if (outline.problem)
    errors.push({
      code: 'BODY_TOO_COMPLEX',
      severity: 'error',
      field: 'body',
      message: outline.problem,
    });

  if (!(content.body ?? '').trim())
    errors.push({
      code: 'BODY_EMPTY',
      severity: 'error',
      field: 'body',
      message: 'The write-up has no text yet: describe what you did, step by step.',
    });

  warnings.push(...cautionFindings({ body: content.body, wireRun: content.wireRun }, outline));

  const reported = new Set<number>();
  for (const ref of outline.images) {
    if (ref.n <= images.length || reported.has(ref.n)) continue;
    reported.add(ref.n);
    errors.push({
      code: 'IMAGE_REF_UNKNOWN',
      severity: 'error',
      field: 'body',
      line: ref.line,
      message: `Line ${ref.line} places image ${ref.n}, but the write-up has ${images.length === 0 ? 'no images' : images.length === 1 ? 'one image' : `${images.length} images`}. Upload it, or change the number.`,
    });
  }
  images.forEach((img, i) => {
    if (!img.caption?.trim())
      warnings.push({
        code: 'IMAGE_NO_CAPTION',
        severity: 'warning',
        field: 'images',
        image: i,
        message: `Image ${i + 1} has no caption: say in a few words what it shows (screen readers read it out).`,
      });
  });

  const run = content.wireRun;
  const totals = wireRunTotals(run);
  totals.lines.forEach((line, i) => {
    const wire = run!.wires[i];
    if (!line.sizeOk)
      warnings.push({
        code: 'WIRE_SIZE_UNKNOWN',
        severity: 'warning',
        field: 'wireRun.wires',
        row: i,
        message: wire.size.trim()
          ? `Wire run ${rowName(i)}: "${wire.size.trim()}" is not a wire size such as "20 AWG" or "0.5 mm²".`
          : `Wire run ${rowName(i)}: give the wire size, such as "20 AWG" or "0.5 mm²".`,
      });
    if (!line.colorOk)
      warnings.push({
        code: 'WIRE_COLOR_UNKNOWN',
        severity: 'warning',
        field: 'wireRun.wires',
        row: i,
        message: wire.color.trim()
          ? `Wire run ${rowName(i)}: "${wire.color.trim()}" is not a known wire colour; use codes such as RD or GN/YE.`
          : `Wire run ${rowName(i)}: give the wire colour, such as RD or GN/YE.`,
      });
    if (line.addedLengthMm > 0 && (!wire.from.trim() || !wire.to.trim()))
      warnings.push({
        code: 'WIRE_ENDS_MISSING',
        severity: 'warning',
        field: 'wireRun.wires',
        row: i,
        message: `Wire run ${rowName(i)}: say where the wire starts and where it now ends.`,
      });
    if (line.drop && line.drop.percent > totals.dropLimitPercent)
      warnings.push({
        code: 'VOLTAGE_DROP_HIGH',
        severity: 'warning',
        field: 'wireRun.wires',
        row: i,
        message: `Wire run ${rowName(i)}: the added length alone drops ${line.drop.volts.toFixed(2)} V (${line.drop.percent.toFixed(1)} % of ${totals.systemVoltage} V), more than ${totals.dropLimitPercent} %. Use a larger wire size or a shorter route.`,
      });
  });

  const parts = content.parts;
  if (parts) {
    parts.items.forEach((item, i) => {
      if (!item.name.trim())
        warnings.push({
          code: 'PART_NAME_MISSING',
          severity: 'warning',
          field: 'parts.items',
          row: i,
          message: `Parts list ${rowName(i)}: name the part.`,
        });
      if (item.priceHigh && item.priceLow > item.priceHigh)
        warnings.push({
          code: 'PRICE_RANGE_REVERSED',
          severity: 'warning',
          field: 'parts.items',
          row: i,
          message: `Parts list ${rowName(i)}: the low price is above the high price; the totals use them the other way round.`,
        });
    });
    for (const i of partsTotals(parts).unassigned)
      warnings.push({
        code: 'PART_IN_NO_OPTION',
        severity: 'warning',
        field: 'parts.items',
        row: i,
        message: `Parts list ${rowName(i)}: the part is in no build option, so no total counts it. Tick the options it belongs to.`,
      });
    parts.options.forEach((o, i) => {
      if (!o.name.trim())
        warnings.push({
          code: 'OPTION_NAME_MISSING',
          severity: 'warning',
          field: 'parts.options',
          row: i,
          message: `Parts list: build option ${i + 1} has no name.`,
        });
    });
  }

  return {
    ok: errors.length === 0,
    errors,
    warnings,
    cautions: cautionMentions({ body: content.body, wireRun: run }, outline).map((m) => m.kind),
    summary: {
      images: images.length,
      markings: images.reduce((n, img) => n + (img.annotations?.length ?? 0), 0),
      placedImages: new Set(outline.images.filter((r) => r.placed).map((r) => r.n)).size,
      wires: totals.wires,
      splices: totals.splices.total,
      partOptions: parts?.options.length ?? 0,
      cautionBlocks: outline.cautions.length,
    },
  };
}
