import type { PartDetail, PartSummary } from '@shared/contracts/parts.ts';
import type { CategoryCode } from '@shared/contracts/part-attributes.ts';
import { can } from '@shared/roles.ts';
import { CATEGORY_LABELS } from '@shared/contracts/part-attributes.ts';
import { centsToDollars } from '@shared/domain/money.ts';
import type { PartDocument } from '../search/parts-index.ts';
import type { Actor } from '../policies/actor.ts';
import type { CatalogueService } from '../services/catalogue.ts';
import type { partMedia } from '../db/schema/index.ts';

type MediaRow = typeof partMedia.$inferSelect;

export const mediaUrl = (id: string) => `/api/media/${id}`;
export const thumbnailUrl = (id: string) => `/api/media/${id}/thumbnail`;

export function presentPartSummary(d: PartDocument): PartSummary {
  return {
    sku: d.sku,
    name: d.name,
    category: d.category,
    maker: d.maker,
    makerName: d.makerName,
    gtin: d.gtin,
    lifecycle: d.lifecycle as PartSummary['lifecycle'],
    ranges: d.ranges,
    packSize: d.packSize,
    unit: d.unit,
    listPriceCents: d.listPriceCents,
    available: d.available,
    inStock: d.inStock,
    thumbnailUrl: d.thumbnailId ? thumbnailUrl(d.thumbnailId) : null,
  };
}

/** One catalogue CSV row; money as a plain decimal figure (decimal arithmetic, no float drift). */
export function presentPartCsvRow(d: PartDocument) {
  return {
    SKU: d.sku,
    Name: d.name,
    Category: CATEGORY_LABELS[d.category],
    Maker: d.makerName,
    GTIN: d.gtin ?? '',
    Lifecycle: d.lifecycle,
    Ranges: d.ranges.join(' '),
    'Pack size': d.packSize,
    Available: d.available,
    'List price (AUD)': d.listPriceCents === null ? '' : centsToDollars(d.listPriceCents),
  };
}

export function presentMedia(m: MediaRow) {
  return {
    id: m.id,
    kind: m.kind,
    contentType: m.contentType,
    fileName: m.fileName,
    bytes: m.bytes,
    url: mediaUrl(m.id),
    thumbnailUrl: m.thumbnailKey ? thumbnailUrl(m.id) : null,
  };
}

/** Cost only for roles that may see it; on-hand and reserved only for staff; supplier SKUs only for staff. */
export function presentPartDetail(actor: Actor, d: Awaited<ReturnType<CatalogueService['detail']>>): PartDetail {
  const p = d.part;
  const viewCost = can(actor.role, 'costs.view');
  const staffStock = can(actor.role, 'stock.view');
  const available = d.stock.reduce((s, w) => s + w.onHand - w.reserved, 0);
  const firstImage = d.media.find((m) => m.kind === 'image' && m.thumbnailKey);
  return {
    id: p.id,
    sku: p.sku,
    name: p.name,
    category: p.category as CategoryCode,
    maker: d.maker.code,
    makerName: d.maker.name,
    gtin: p.gtin,
    lifecycle: p.lifecycle,
    ranges: d.ranges,
    packSize: p.packSize,
    unit: p.unit,
    listPriceCents: p.listPriceCents,
    available,
    inStock: available > 0,
    thumbnailUrl: firstImage ? thumbnailUrl(firstImage.id) : null,
    description: p.description,
    widthMm: p.widthMm,
    heightMm: p.heightMm,
    depthMm: p.depthMm,
    massKg: p.massKg,
    ipRating: p.ipRating,
    supersededBy: d.successor,
    supersedes: d.predecessors,
    dangerousGoods: p.unNumber && p.whRating ? { unNumber: p.unNumber as 'UN3480' | 'UN3481', class: '9', whRating: p.whRating } : null,
    attributes: p.attributes as Record<string, unknown>,
    compliance: p.compliance as Record<string, unknown> | null,
    ...(d.supplierSkus ? { supplierSkus: d.supplierSkus } : {}),
    ...(viewCost ? { costCents: p.costCents } : {}),
    media: d.media.map(presentMedia),
    stock: d.stock.map((w) =>
      staffStock
        ? { warehouse: w.warehouse, warehouseName: w.warehouseName, available: w.onHand - w.reserved, onHand: w.onHand, reserved: w.reserved }
        : { warehouse: w.warehouse, warehouseName: w.warehouseName, available: w.onHand - w.reserved },
    ),
    archived: p.archivedAt !== null,
    updatedAt: p.updatedAt.toISOString(),
    abilities: { edit: can(actor.role, 'catalogue.edit'), viewCost },
  };
}
