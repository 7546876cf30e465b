import type { ReactNode } from 'react';
import type { CategoryCode } from '@shared/contracts/part-attributes.ts';
import { CATEGORY_LABELS } from '@shared/contracts/part-attributes.ts';

/*
 * Generic outline drawings, one per category, shown where a part has no photo. Drawn on a
 * 64 × 64 grid in the current text colour; the stroke stays the same width on screen
 * whatever size the drawing is shown at.
 */

const L = (d: string) => <path d={d} />;

const DRAWINGS: Record<CategoryCode, ReactNode> = {
  // A module: a box with two terminals on top, a side connector and cooling ribs.
  module: (
    <>
      <rect x="8" y="18" width="48" height="32" rx="2" />
      <rect x="16" y="12" width="8" height="6" rx="1" />
      <rect x="40" y="12" width="8" height="6" rx="1" />
      {L('M19 14.5h2 M44 13.5v2 M43 14.5h2')}
      {L('M14 26h20 M14 31h20 M14 36h20')}
      <rect x="42" y="28" width="8" height="10" rx="1" />
      {L('M8 50v3h48v-3')}
    </>
  ),
  // A controller: a box with a state-of-charge display, a breaker toggle and a status light.
  controller: (
    <>
      <rect x="8" y="14" width="48" height="38" rx="3" />
      <rect x="14" y="20" width="22" height="12" rx="1" />
      {L('M17 26h4 M23 26h4 M29 26h4')}
      <rect x="42" y="20" width="8" height="14" rx="1" />
      <rect x="44" y="22" width="4" height="5" />
      <circle cx="17" cy="42" r="2" />
      {L('M24 42h12 M24 46h8')}
      {L('M8 52v2h48v-2')}
    </>
  ),
  // Feet: a base plate on four threaded posts with round pads.
  feet: (
    <>
      <rect x="6" y="18" width="52" height="8" rx="1" />
      {L('M14 26v16 M26 26v16 M38 26v16 M50 26v16')}
      {L('M12 30h4 M12 34h4 M12 38h4 M24 30h4 M24 34h4 M24 38h4 M36 30h4 M36 34h4 M36 38h4 M48 30h4 M48 34h4 M48 38h4')}
      {L('M9 46h10l-2 -4h-6z M21 46h10l-2 -4h-6z M33 46h10l-2 -4h-6z M45 46h10l-2 -4h-6z')}
    </>
  ),
  // A wall bracket: an angle with slotted holes, seen from the front.
  'wall-bracket': (
    <>
      {L('M12 10h12v34h28v10H12z')}
      {L('M24 44l-12 10')}
      <rect x="16" y="16" width="4" height="9" rx="2" />
      <rect x="16" y="31" width="4" height="9" rx="2" />
      <rect x="32" y="47" width="9" height="4" rx="2" />
      <rect x="44" y="47" width="5" height="4" rx="2" />
    </>
  ),
  // An end cap: a shallow cover with the connector's recess inside.
  'end-cap': (
    <>
      <rect x="10" y="20" width="44" height="24" rx="6" />
      <rect x="20" y="27" width="24" height="10" rx="2" />
      {L('M25 30v4 M30 30v4 M34 30v4 M39 30v4')}
      {L('M10 32h-4 M58 32h-4')}
    </>
  ),
  // A cable set: two leads, a plug at one end and ring lugs at the other.
  'cable-set': (
    <>
      <rect x="6" y="14" width="12" height="8" rx="2" />
      <rect x="6" y="38" width="12" height="8" rx="2" />
      {L('M18 18c14 0 12 10 26 10h6 M18 42c14 0 12 -10 26 -10h6')}
      <circle cx="54" cy="28" r="3" />
      <circle cx="54" cy="36" r="3" />
      {L('M50 28h1 M50 36h1')}
    </>
  ),
  // A cable-protection cover: a clip-on channel in perspective.
  'cable-cover': (
    <>
      {L('M8 40l40 -24h8l-40 24z')}
      {L('M8 40v6h8l40 -24v-6')}
      {L('M16 46v-6')}
      {L('M20 36l4 2 M30 30l4 2 M40 24l4 2')}
    </>
  ),
  // An earth bonding lead: a lead with a ring lug and the earth sign.
  'earth-lead': (
    <>
      <circle cx="12" cy="16" r="4" />
      {L('M16 17l4 1c10 4 -4 14 8 18s14 -6 20 0v6')}
      {L('M38 42h20 M42 47h12 M46 52h4')}
    </>
  ),
  // A comms terminator: a small plug with a resistor inside.
  'comms-terminator': (
    <>
      <rect x="14" y="18" width="30" height="28" rx="3" />
      <rect x="44" y="24" width="10" height="16" rx="1" />
      {L('M46 28h6 M46 32h6 M46 36h6')}
      {L('M18 32h4l2 -5l3 10l3 -10l3 10l3 -10l2 5h2')}
    </>
  ),
  // An inverter: a box with cooling fins and a wave on its display.
  inverter: (
    <>
      <rect x="12" y="8" width="40" height="48" rx="3" />
      <rect x="18" y="14" width="28" height="12" rx="1" />
      {L('M21 20c3 -6 5 -6 7 0s5 6 7 0s5 -6 7 0')}
      {L('M18 34h28 M18 38h28 M18 42h28 M18 46h28')}
      {L('M22 56v3 M42 56v3')}
    </>
  ),
  // An accessory: a parcel with its label.
  accessory: (
    <>
      {L('M10 22l22 -10l22 10v22l-22 10l-22 -10z')}
      {L('M10 22l22 10l22 -10 M32 32v22')}
      {L('M21 17l22 10v7')}
    </>
  ),
};

export function PartOutline({ category, className = 'h-10 w-10', stroke = 1.5, title }: { category: CategoryCode; className?: string; stroke?: number; title?: string }) {
  const labelled = title !== undefined;
  return (
    <svg
      viewBox="0 0 64 64"
      className={`${className} [&_*]:[vector-effect:non-scaling-stroke]`}
      fill="none"
      stroke="currentColor"
      strokeWidth={stroke}
      strokeLinecap="round"
      strokeLinejoin="round"
      role={labelled ? 'img' : undefined}
      aria-label={labelled ? title || `Outline drawing of a ${CATEGORY_LABELS[category].toLowerCase()}` : undefined}
      aria-hidden={labelled ? undefined : true}
    >
      {DRAWINGS[category]}
    </svg>
  );
}
