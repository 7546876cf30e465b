import { useId, type ReactNode } from 'react';

interface StepperProps {
  label: string;
  /** As typed: a half-typed or out-of-range number stays in the box so the page can say what is wrong. */
  value: string;
  onChange: (value: string) => void;
  min: number;
  max: number;
  hint?: ReactNode;
  /** Words for the buttons, e.g. "One module fewer". */
  lessLabel: string;
  moreLabel: string;
}

/** A whole-number box with − and + either side, held to min–max by the buttons. */
export function Stepper({ label, value, onChange, min, max, hint, lessLabel, moreLabel }: StepperProps) {
  const id = useId();
  const n = Number(value);
  const known = value.trim() !== '' && Number.isFinite(n);
  const step = (d: number) => onChange(String(Math.min(max, Math.max(min, (known ? Math.round(n) : min) + d))));
  const button = 'inline-flex h-8 w-8 items-center justify-center border border-line bg-card text-lg font-semibold leading-none text-ink hover:border-ink-soft disabled:cursor-not-allowed disabled:opacity-40';
  return (
    <div>
      <label htmlFor={id} className="mb-1 block text-xs font-semibold text-ink-soft">
        {label}
      </label>
      <div className="flex items-stretch">
        <button type="button" className={`${button} rounded-l-md`} aria-label={lessLabel} disabled={known && n <= min} onClick={() => step(-1)}>
          −
        </button>
        <input
          id={id}
          type="number"
          inputMode="numeric"
          min={min}
          max={max}
          step={1}
          value={value}
          onChange={(e) => onChange(e.target.value)}
          className="num h-8 w-16 border-y border-line bg-card text-center text-sm text-ink [appearance:textfield] [&::-webkit-inner-spin-button]:appearance-none"
        />
        <button type="button" className={`${button} rounded-r-md`} aria-label={moreLabel} disabled={known && n >= max} onClick={() => step(1)}>
          +
        </button>
      </div>
      {hint && <p className="mt-1 text-xs text-ink-soft">{hint}</p>}
    </div>
  );
}
