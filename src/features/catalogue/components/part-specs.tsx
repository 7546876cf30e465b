import type { ReactNode } from 'react';
import type { PartDetail } from '@shared/contracts/parts.ts';
import { ATTRIBUTE_FIELDS, type AttributeField } from '@shared/contracts/part-attributes.ts';
import { Card } from '@/components/ui/page.tsx';
import { formatDate, withUnit } from '@/lib/format.ts';

/** Attributes about size, fit and fixing rather than electricity; everything else is electrical. */
const PHYSICAL_KEYS = new Set(['unitsPerSet', 'heightMm', 'adjustmentMm', 'loadRatingKg', 'fixing', 'unitsSupported', 'lengthM', 'material', 'purpose', 'connectorType', 'connector']);

const UNIT_WORDS: Record<string, string> = { each: 'each', pack: 'pack', set: 'set', m: 'metre' };

const sentenceCase = (s: string) => (s ? s[0]!.toUpperCase() + s.slice(1) : s);

export function formatAttribute(field: AttributeField, value: unknown): string {
  if (value === undefined || value === null || value === '') return '—';
  switch (field.kind) {
    case 'number':
    case 'integer':
      return typeof value === 'number' ? withUnit(value, field.unit) : String(value);
    case 'boolean':
      return value ? 'Yes' : 'No';
    case 'list':
      return Array.isArray(value) && value.length ? value.join(', ') : '—';
    case 'enum':
      return sentenceCase(String(value));
    default:
      return String(value);
  }
}

export function formatDimensions(p: Pick<PartDetail, 'widthMm' | 'heightMm' | 'depthMm'>) {
  if (p.widthMm === null && p.heightMm === null && p.depthMm === null) return null;
  const d = (n: number | null) => (n === null ? '?' : withUnit(n));
  return `${d(p.widthMm)} × ${d(p.heightMm)} × ${d(p.depthMm)} mm`;
}

export function packText(p: Pick<PartDetail, 'unit' | 'packSize'>) {
  if (p.unit === 'm') return 'Sold by the metre';
  if (p.packSize > 1) return `${UNIT_WORDS[p.unit] === 'pack' ? 'Pack' : sentenceCase(UNIT_WORDS[p.unit] ?? p.unit)} of ${p.packSize}`;
  return sentenceCase(UNIT_WORDS[p.unit] ?? p.unit);
}

/** A label, its value, and whether the value is a figure or code (set in mono). */
type Row = [label: string, value: ReactNode, mono?: boolean];

function SpecCard({ title, rows, children }: { title: string; rows?: Row[]; children?: ReactNode }) {
  return (
    <Card className="p-3">
      <h2 className="mb-2 text-sm font-semibold">{title}</h2>
      {rows && (
        <dl className="grid grid-cols-[minmax(7rem,1fr)_minmax(0,auto)] gap-x-4 gap-y-1 text-sm">
          {rows.map(([label, value, mono = true]) => (
            <div key={label} className="contents">
              <dt className="text-ink-soft">{label}</dt>
              <dd className={`text-right break-words ${mono ? 'num' : ''}`}>{value}</dd>
            </div>
          ))}
        </dl>
      )}
      {children}
    </Card>
  );
}

/** The part's facts in groups: Electrical, Physical, Compliance, Dangerous goods, Supplier SKUs. */
export function PartSpecs({ part }: { part: PartDetail }) {
  const fields = ATTRIBUTE_FIELDS[part.category] ?? [];
  const present = fields.filter((f) => part.attributes[f.key] !== undefined && part.attributes[f.key] !== null);
  const row = (f: AttributeField): Row => [f.label, formatAttribute(f, part.attributes[f.key]), f.kind === 'number' || f.kind === 'integer' || f.kind === 'list'];
  const electrical: Row[] = present.filter((f) => !PHYSICAL_KEYS.has(f.key)).map(row);
  const physical: Row[] = [['Sold as', packText(part), false], ['Mass', withUnit(part.massKg, 'kg')]];
  const dims = formatDimensions(part);
  if (dims) physical.push(['Size (W × H × D)', dims]);
  if (part.ipRating) physical.push(['IP rating', part.ipRating]);
  physical.push(...present.filter((f) => PHYSICAL_KEYS.has(f.key)).map(row));

  const c = part.compliance as { standardsTestedTo?: string[]; certificationListing?: string; certificationDate?: string; enclosureIp?: string; touchSafeConnectors?: boolean } | null;
  const compliance: Row[] = [];
  if (c) {
    if (c.certificationListing) compliance.push(['Listing', c.certificationListing, false]);
    if (c.certificationDate) compliance.push(['Certified', formatDate(c.certificationDate), false]);
    if (c.enclosureIp) compliance.push(['Enclosure', c.enclosureIp]);
    if (c.touchSafeConnectors !== undefined) compliance.push(['Touch-safe connectors', c.touchSafeConnectors ? 'Yes' : 'No', false]);
  }
  const dg = part.dangerousGoods;

  return (
    <div className="grid gap-3 md:grid-cols-2 xl:grid-cols-3">
      {electrical.length > 0 && <SpecCard title="Electrical" rows={electrical} />}
      <SpecCard title="Physical" rows={physical} />
      <SpecCard title="Compliance" rows={compliance}>
        {c?.standardsTestedTo && c.standardsTestedTo.length > 0 ? (
          <div className={compliance.length ? 'mt-2 border-t border-line pt-2' : ''}>
            <p className="text-xs text-ink-soft">Tested to</p>
            <ul className="mt-1 flex flex-wrap gap-1">
              {c.standardsTestedTo.map((s) => (
                <li key={s} className="num rounded border border-line bg-paper px-1.5 py-0.5 text-xs">
                  {s}
                </li>
              ))}
            </ul>
          </div>
        ) : (
          !compliance.length && <p className="text-sm text-ink-soft">No compliance details recorded.</p>
        )}
      </SpecCard>
      {dg && (
        <SpecCard
          title="Dangerous goods"
          rows={[
            ['UN number', dg.unNumber],
            ['Class', dg.class],
            ['Energy rating', withUnit(dg.whRating, 'Wh')],
          ]}
        />
      )}
      {part.supplierSkus && (
        <SpecCard title="Supplier SKUs" rows={part.supplierSkus.map((s): Row => [s.supplier, s.sku])}>
          {part.supplierSkus.length === 0 && <p className="text-sm text-ink-soft">No supplier codes recorded.</p>}
        </SpecCard>
      )}
    </div>
  );
}
