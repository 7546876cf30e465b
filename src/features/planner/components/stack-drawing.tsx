import type { Dvc } from '@shared/domain/energy.ts';
import type { StackUnit } from '@shared/domain/planner.ts';
import { formatNumber } from '@/lib/format.ts';

interface StackDrawingProps {
  /** One stack, top to bottom, as the planner returns it. */
  units: StackUnit[];
  heightMm: number;
  unitWidthMm: number;
  stacks: number;
  dvc: Dvc;
  bracketsPerStack: number;
  controllerHasDisplay?: boolean;
}

// Drawing space (SVG units). The stack itself is scaled in mm; the frame around it is fixed.
const VIEW_W = 360;
const VIEW_H = 540;
const TOP = 56;
const FLOOR_Y = VIEW_H - 56;
const RULER_X = 50;
const STACK_AREA = { left: 100, width: 150 };
/** Used when no unit gives a width, so the drawing still shows the height. */
const FALLBACK_WIDTH_MM = 600;
const REFERENCE_MM = [1500, 2000];

const DVC_RANGE: Record<Dvc, string> = { A: 'up to 60 V DC', B: '60–120 V DC', C: 'above 120 V DC' };

const metres = (mm: number) => `${formatNumber(mm / 1000)} m`;

/** Front view of one stack to scale: feet, modules, controller, height dimension, brackets and DC class. */
export function StackDrawing({ units, heightMm, unitWidthMm, stacks, dvc, bracketsPerStack, controllerHasDisplay }: StackDrawingProps) {
  const drawnMm = units.reduce((s, u) => s + u.heightMm, 0);
  const totalMm = drawnMm || heightMm;
  // The axis always reaches past 2 m so stacks of different sizes read against the same marks.
  const axisMm = Math.ceil((Math.max(REFERENCE_MM[1], totalMm) + 200) / 250) * 250;
  const pxPerMm = (FLOOR_Y - TOP) / axisMm;
  const y = (mmFromFloor: number) => FLOOR_Y - mmFromFloor * pxPerMm;

  const widthMm = unitWidthMm > 0 ? unitWidthMm : FALLBACK_WIDTH_MM;
  const w = widthMm * pxPerMm;
  const x = STACK_AREA.left + (STACK_AREA.width - w) / 2;
  const right = x + w;
  const topY = y(totalMm);

  // Units from the top down; each edge is placed from its cumulative height so rounding never drifts.
  let above = 0;
  const placed = units.map((u) => {
    const top = totalMm - above;
    above += u.heightMm;
    return { unit: u, y0: y(top), y1: y(top - u.heightMm) };
  });
  const moduleCount = units.filter((u) => u.kind === 'module').length;
  const feet = units.find((u) => u.kind === 'feet');
  const bodyBottomMm = feet?.heightMm ?? 0;
  const bracketMm = Array.from({ length: bracketsPerStack }, (_, i) => bodyBottomMm + ((i + 1) * (totalMm - bodyBottomMm)) / (bracketsPerStack + 1));

  const ticks: number[] = [];
  for (let mm = 500; mm <= axisMm; mm += 500) ticks.push(mm);
  const dimX = right + 30;
  const label = `Front view of one stack, to scale: controller on ${moduleCount} module${moduleCount === 1 ? '' : 's'} on feet, ${formatNumber(totalMm)} mm tall, ${formatNumber(widthMm)} mm wide, DVC-${dvc}${stacks > 1 ? `; the system has ${stacks} stacks like it` : ''}${bracketsPerStack ? `; ${bracketsPerStack} wall bracket${bracketsPerStack === 1 ? '' : 's'} per stack` : ''}.`;

  return (
    <svg viewBox={`0 0 ${VIEW_W} ${VIEW_H}`} role="img" aria-label={label} className="h-auto w-full max-w-[380px] text-ink" data-height-mm={totalMm}>
      <defs>
        <marker id="dim-arrow" viewBox="0 0 8 8" refX="4" refY="4" markerWidth="7" markerHeight="7" orient="auto-start-reverse">
          <path d="M0,0 L8,4 L0,8 z" className="fill-ink print:fill-black" />
        </marker>
        <pattern id="floor-hatch" width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
          <line x1="0" y1="0" x2="0" y2="8" className="stroke-ink-soft print:stroke-black" strokeWidth="1" />
        </pattern>
      </defs>

      {/* Stack count and the DC voltage class, top of the sheet */}
      <text x={16} y={24} className="fill-ink text-[13px] font-semibold print:fill-black">
        {stacks > 1 ? `×${stacks} stacks` : '1 stack'}
      </text>
      <text x={16} y={40} className="fill-ink-soft text-[10px] print:fill-black">
        {stacks > 1 ? 'one drawn; the others are the same' : 'front view'}
      </text>
      <g aria-hidden="true">
        <rect x={VIEW_W - 104} y={8} width={92} height={38} rx={6} className="fill-card stroke-ink print:fill-white print:stroke-black" strokeWidth={2} />
        <text x={VIEW_W - 58} y={27} textAnchor="middle" className="num fill-ink text-[14px] font-semibold print:fill-black">
          DVC-{dvc}
        </text>
        <text x={VIEW_W - 58} y={40} textAnchor="middle" className="fill-ink-soft text-[8.5px] print:fill-black">
          {DVC_RANGE[dvc]}
        </text>
      </g>

      {/* Ruler with 1.5 m and 2 m reference marks */}
      <g aria-hidden="true">
        <line x1={RULER_X} y1={FLOOR_Y} x2={RULER_X} y2={y(axisMm)} className="stroke-ink print:stroke-black" strokeWidth={1} />
        {ticks.map((mm) => {
          const ref = REFERENCE_MM.includes(mm);
          return (
            <g key={mm}>
              {ref && <line x1={RULER_X} y1={y(mm)} x2={VIEW_W - 12} y2={y(mm)} className="stroke-ink-soft print:stroke-black" strokeWidth={0.75} strokeDasharray="4 4" />}
              <line x1={RULER_X - (ref ? 8 : 5)} y1={y(mm)} x2={RULER_X} y2={y(mm)} className="stroke-ink print:stroke-black" strokeWidth={ref ? 1.5 : 1} />
              <text x={RULER_X - 11} y={y(mm) + 3.5} textAnchor="end" className={`num fill-ink print:fill-black ${ref ? 'text-[11px] font-semibold' : 'fill-ink-soft text-[9.5px]'}`}>
                {metres(mm)}
              </text>
            </g>
          );
        })}
        <text x={RULER_X - 11} y={FLOOR_Y + 3.5} textAnchor="end" className="num fill-ink-soft text-[9.5px] print:fill-black">
          0 m
        </text>
      </g>

      {/* The stack */}
      <g aria-hidden="true">
        {placed.map(({ unit, y0, y1 }, i) => {
          const h = y1 - y0;
          if (unit.kind === 'feet') {
            const plinth = Math.max(2, h * 0.45);
            const footW = Math.max(6, w * 0.14);
            return (
              <g key={i}>
                <rect x={x + 2} y={y0} width={w - 4} height={plinth} className="fill-ink/80 print:fill-black" />
                <rect x={x + 4} y={y0 + plinth} width={footW} height={h - plinth} className="fill-ink print:fill-black" />
                <rect x={right - 4 - footW} y={y0 + plinth} width={footW} height={h - plinth} className="fill-ink print:fill-black" />
              </g>
            );
          }
          if (unit.kind === 'controller') {
            return (
              <g key={i}>
                <rect x={x} y={y0} width={w} height={h} rx={3} className="fill-copper/15 stroke-copper print:fill-white print:stroke-black" strokeWidth={1.75} />
                {controllerHasDisplay && h > 10 && (
                  <rect x={right - w * 0.36} y={y0 + h * 0.25} width={w * 0.26} height={Math.min(h * 0.4, 12)} rx={1.5} className="fill-ink print:fill-black" />
                )}
                {h >= 13 && (
                  <text x={x + 8} y={y0 + h / 2 + 3.5} className="fill-copper-dark text-[10px] font-semibold print:fill-black">
                    Controller
                  </text>
                )}
              </g>
            );
          }
          const n = i; // the controller is row 0, so modules count from 1
          return (
            <g key={i}>
              <rect x={x} y={y0} width={w} height={h} rx={2} className="fill-card stroke-ink print:fill-white print:stroke-black" strokeWidth={1.25} />
              <line x1={x + w * 0.12} y1={y0 + h * 0.5} x2={x + w * 0.3} y2={y0 + h * 0.5} className="stroke-ink-soft print:stroke-black" strokeWidth={1} />
              {h >= 12 && (
                <text x={right - 8} y={y0 + h / 2 + 3.5} textAnchor="end" className="fill-ink-soft text-[9.5px] print:fill-black">
                  Module {n}
                </text>
              )}
            </g>
          );
        })}

        {/* Wall brackets: tabs either side, evenly spaced up the stack */}
        {bracketMm.map((mm) => (
          <g key={mm}>
            <rect x={x - 7} y={y(mm) - 2.5} width={7} height={5} className="fill-ink print:fill-black" />
            <rect x={right} y={y(mm) - 2.5} width={7} height={5} className="fill-ink print:fill-black" />
          </g>
        ))}
      </g>

      {/* Height dimension */}
      <g aria-hidden="true">
        <line x1={right + 4} y1={topY} x2={dimX + 6} y2={topY} className="stroke-ink print:stroke-black" strokeWidth={0.75} />
        <line x1={dimX} y1={topY} x2={dimX} y2={FLOOR_Y} className="stroke-ink print:stroke-black" strokeWidth={1} markerStart="url(#dim-arrow)" markerEnd="url(#dim-arrow)" />
        <text x={dimX + 14} y={(topY + FLOOR_Y) / 2} transform={`rotate(-90 ${dimX + 14} ${(topY + FLOOR_Y) / 2})`} textAnchor="middle" className="num fill-ink text-[12px] font-semibold print:fill-black">
          {formatNumber(totalMm)} mm
        </text>
      </g>

      {/* Floor */}
      <g aria-hidden="true">
        <rect x={RULER_X} y={FLOOR_Y} width={VIEW_W - 12 - RULER_X} height={10} fill="url(#floor-hatch)" />
        <line x1={RULER_X} y1={FLOOR_Y} x2={VIEW_W - 12} y2={FLOOR_Y} className="stroke-ink print:stroke-black" strokeWidth={1.5} />
        <text x={x + w / 2} y={FLOOR_Y + 26} textAnchor="middle" className="num fill-ink-soft text-[10px] print:fill-black">
          ← {formatNumber(widthMm)} mm →
        </text>
        {bracketsPerStack > 0 && (
          <g>
            <rect x={16} y={VIEW_H - 14} width={7} height={5} className="fill-ink print:fill-black" />
            <text x={28} y={VIEW_H - 9} className="fill-ink-soft text-[10px] print:fill-black">
              wall bracket, {bracketsPerStack} per stack (spacing indicative)
            </text>
          </g>
        )}
      </g>
    </svg>
  );
}
