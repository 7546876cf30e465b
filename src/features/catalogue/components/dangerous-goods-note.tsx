import type { PartDetail } from '@shared/contracts/parts.ts';
import { Notice } from '@/components/ui/notice.tsx';
import { withUnit } from '@/lib/format.ts';

/** Above this a unit is a two-person lift (common practice for manual handling). */
const HEAVY_KG = 25;

const UN_NAMES: Record<string, string> = {
  UN3480: 'lithium-ion batteries',
  UN3481: 'lithium-ion batteries contained in or packed with equipment',
};

export const carriesCells = (p: Pick<PartDetail, 'category' | 'attributes'>) => p.category === 'module' || (p.category === 'controller' && p.attributes.carriesCells === true);

/** Handling reminders for parts with cells (and for anything heavy). Words, not a copy of the transport mark. */
export function DangerousGoodsNote({ part }: { part: PartDetail }) {
  const cells = carriesCells(part) || !!part.dangerousGoods;
  const heavy = part.massKg > HEAVY_KG;
  if (!cells && !heavy) return null;
  if (!cells)
    return (
      <Notice tone="caution" title="Heavy">
        <p>{withUnit(part.massKg, 'kg')}: two-person lift, or use a lifting aid.</p>
      </Notice>
    );
  const dg = part.dangerousGoods;
  return (
    <Notice tone="caution" title="Contains lithium cells: handle and ship as dangerous goods">
      <ul className="mt-1 list-disc space-y-0.5 pl-4">
        {dg ? (
          <li>
            <span className="num font-semibold">{dg.unNumber}</span>, Class <span className="num font-semibold">{dg.class}</span> ({UN_NAMES[dg.unNumber] ?? 'lithium batteries'}), rated{' '}
            <span className="num font-semibold">{withUnit(dg.whRating, 'Wh')}</span>.
          </li>
        ) : (
          <li>The UN number and Wh rating are missing: edit the part and add them before it ships.</li>
        )}
        {heavy && (
          <li>
            Heavy: <span className="num">{withUnit(part.massKg, 'kg')}</span>, two-person lift.
          </li>
        )}
        <li>Keep the terminal covers on in storage and in transit.</li>
        <li>Inspect on arrival and before dispatch; quarantine damaged, swollen or hot units and do not ship them.</li>
      </ul>
    </Notice>
  );
}
