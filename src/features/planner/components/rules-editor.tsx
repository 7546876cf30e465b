import { useFieldArray, useWatch, type Control, type FieldErrors, type UseFormRegister, type UseFormSetValue } from 'react-hook-form';
import { BOM_BASES } from '@shared/domain/bom-rules.ts';
import { COUNTRIES, COUNTRY_LABELS, FLOORS, FLOOR_LABELS, LOCATIONS, LOCATION_LABELS, WALLS, WALL_LABELS } from '@shared/domain/site.ts';
import type { PlannerPart } from '@shared/domain/planner.ts';
import { Button } from '@/components/ui/button.tsx';
import { FieldError } from '@/components/ui/field.tsx';
import { BASIS_LABELS, CONDITION_LABELS, EMPTY_RULE, conditionOfKind, type ConditionKind, type RangeFormValues } from './range-form-values.ts';

const cell = 'w-full rounded-md border border-line bg-card px-2 py-1 text-sm text-ink aria-[invalid=true]:border-danger disabled:bg-paper disabled:text-ink-soft/60';
const optionalNumber = (v: unknown) => (v === '' || v === null || v === undefined || Number.isNaN(v) ? undefined : Number(v));

interface RulesEditorProps {
  control: Control<RangeFormValues>;
  register: UseFormRegister<RangeFormValues>;
  setValue: UseFormSetValue<RangeFormValues>;
  errors: FieldErrors<RangeFormValues>;
  catalogue: Record<string, PlannerPart>;
}

/** A select over a closed list of site values, for a rule's condition parameter. */
function ParamSelect<T extends string>({ label, values, labels, field }: { label: string; values: readonly T[]; labels: Record<T, string>; field: ReturnType<UseFormRegister<RangeFormValues>> }) {
  return (
    <select aria-label={label} className={cell} {...field}>
      {values.map((v) => (
        <option key={v} value={v}>
          {labels[v]}
        </option>
      ))}
    </select>
  );
}

/** The first message zod gave for a condition or one of its parameters. */
function conditionError(error: unknown): string {
  const e = error as { message?: string } & Record<string, { message?: string } | undefined>;
  return e.message ?? e.mm?.message ?? e.upToM?.message ?? e.overM?.message ?? 'Check this condition.';
}

/** The range's BOM rules as rows: a part, how its quantity scales, and when it applies. */
export function RulesEditor({ control, register, setValue, errors, catalogue }: RulesEditorProps) {
  const { fields, append, remove } = useFieldArray({ control, name: 'rules' });
  const rules = useWatch({ control, name: 'rules' });
  const skus = Object.keys(catalogue).sort();

  return (
    <section aria-labelledby="rules-heading" className="space-y-2">
      <div className="flex items-end justify-between gap-2">
        <div>
          <h2 id="rules-heading" className="text-base font-semibold">
            BOM rules
          </h2>
          <p className="text-xs text-ink-soft">The controller and modules are always on the BOM; these rules add everything else.</p>
        </div>
        <Button onClick={() => append({ ...EMPTY_RULE, when: { kind: 'always' } })}>+ Add rule</Button>
      </div>
      <datalist id="catalogue-skus">
        {skus.map((s) => (
          <option key={s} value={s}>
            {catalogue[s]!.name}
          </option>
        ))}
      </datalist>
      <div className="overflow-x-auto rounded-lg border border-line bg-card">
        <table className="w-full border-collapse text-sm" aria-label="BOM rules">
          <thead className="bg-[#efece4] text-xs font-semibold uppercase tracking-wide text-ink-soft">
            <tr>
              <th scope="col" className="w-8 border-b border-line px-2 py-1.5 text-right">
                #
              </th>
              <th scope="col" className="border-b border-line px-2 py-1.5 text-left">
                Part SKU
              </th>
              <th scope="col" className="border-b border-line px-2 py-1.5 text-left">
                Basis
              </th>
              <th scope="col" className="w-20 border-b border-line px-2 py-1.5 text-left">
                Qty
              </th>
              <th scope="col" className="w-24 border-b border-line px-2 py-1.5 text-left">
                Divisor
              </th>
              <th scope="col" className="border-b border-line px-2 py-1.5 text-left">
                When
              </th>
              <th scope="col" className="border-b border-line px-2 py-1.5">
                <span className="sr-only">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {fields.map((f, i) => {
              const row = rules?.[i];
              const e = errors.rules?.[i];
              const n = i + 1;
              const kind: ConditionKind = row?.when?.kind ?? 'always';
              const part = row?.sku ? catalogue[row.sku.trim().toUpperCase()] : undefined;
              const hasError = !!(e?.sku || e?.qty || e?.divisor || e?.basis || e?.when);
              return (
                <tr key={f.id} data-testid={`rule-row-${n}`} aria-label={`Rule ${n}`} className={`border-b border-line/70 align-top last:border-0 ${hasError ? 'bg-danger-soft/60' : ''}`}>
                  <td className="num px-2 pb-1.5 pt-3 text-right text-ink-soft">{n}</td>
                  <td className="min-w-52 px-2 py-1.5">
                    <input list="catalogue-skus" aria-label={`Part SKU, rule ${n}`} aria-invalid={e?.sku ? true : undefined} className={`${cell} num uppercase`} {...register(`rules.${i}.sku`, { setValueAs: (v: string) => v.trim().toUpperCase() })} />
                    {e?.sku ? <FieldError>{e.sku.message}</FieldError> : <p className="mt-0.5 truncate text-xs text-ink-soft">{part ? part.name : row?.sku ? 'not in the catalogue list' : ' '}</p>}
                  </td>
                  <td className="px-2 py-1.5">
                    <select aria-label={`Basis, rule ${n}`} className={cell} {...register(`rules.${i}.basis`)}>
                      {BOM_BASES.map((b) => (
                        <option key={b} value={b}>
                          {BASIS_LABELS[b]}
                        </option>
                      ))}
                    </select>
                  </td>
                  <td className="px-2 py-1.5">
                    <input type="number" min={1} step={1} aria-label={`Quantity, rule ${n}`} aria-invalid={e?.qty ? true : undefined} className={`${cell} num`} {...register(`rules.${i}.qty`, { valueAsNumber: true })} />
                    {e?.qty && <FieldError>{e.qty.message}</FieldError>}
                  </td>
                  <td className="px-2 py-1.5">
                    <input
                      type="number"
                      min={1}
                      step={1}
                      aria-label={`Divisor (modules per part), rule ${n}`}
                      aria-invalid={e?.divisor ? true : undefined}
                      className={`${cell} num`}
                      placeholder={row?.basis === 'per-n-modules' ? 'N' : '—'}
                      {...register(`rules.${i}.divisor`, { setValueAs: optionalNumber, disabled: row?.basis !== 'per-n-modules' })}
                    />
                    {e?.divisor && <FieldError>{e.divisor.message}</FieldError>}
                  </td>
                  <td className="px-2 py-1.5">
                    <div className="flex gap-1.5">
                      <select
                        aria-label={`When, rule ${n}`}
                        className={cell}
                        {...register(`rules.${i}.when.kind`, {
                          // A new kind starts with its own parameter filled in, so the row stays valid.
                          onChange: (e: { target: { value: string } }) => setValue(`rules.${i}.when`, conditionOfKind(e.target.value as ConditionKind), { shouldDirty: true }),
                        })}
                      >
                        {(Object.keys(CONDITION_LABELS) as ConditionKind[]).map((k) => (
                          <option key={k} value={k}>
                            {CONDITION_LABELS[k]}
                          </option>
                        ))}
                      </select>
                      {kind === 'height-over' && (
                        <span className="flex items-center gap-1">
                          <input type="number" min={1} step={1} aria-label={`Height in mm, rule ${n}`} aria-invalid={e?.when ? true : undefined} className={`${cell} num w-20`} {...register(`rules.${i}.when.mm`, { setValueAs: optionalNumber })} />
                          <span className="text-xs text-ink-soft">mm</span>
                        </span>
                      )}
                      {kind === 'wall' && <ParamSelect label={`Wall, rule ${n}`} values={WALLS} labels={WALL_LABELS} field={register(`rules.${i}.when.wall`)} />}
                      {kind === 'location' && <ParamSelect label={`Location, rule ${n}`} values={LOCATIONS} labels={LOCATION_LABELS} field={register(`rules.${i}.when.location`)} />}
                      {kind === 'floor' && <ParamSelect label={`Floor, rule ${n}`} values={FLOORS} labels={FLOOR_LABELS} field={register(`rules.${i}.when.floor`)} />}
                      {kind === 'country' && <ParamSelect label={`Country, rule ${n}`} values={COUNTRIES} labels={COUNTRY_LABELS} field={register(`rules.${i}.when.country`)} />}
                      {kind === 'run-within' && (
                        <span className="flex items-center gap-1">
                          <span className="text-xs text-ink-soft">over</span>
                          <input type="number" min={0} step={0.5} aria-label={`Cable run over (m), rule ${n}`} aria-invalid={e?.when ? true : undefined} className={`${cell} num w-16`} {...register(`rules.${i}.when.overM`, { setValueAs: optionalNumber })} />
                          <span className="text-xs text-ink-soft">up to</span>
                          <input type="number" min={0} step={0.5} aria-label={`Cable run up to (m), rule ${n}`} aria-invalid={e?.when ? true : undefined} className={`${cell} num w-16`} {...register(`rules.${i}.when.upToM`, { setValueAs: optionalNumber })} />
                          <span className="text-xs text-ink-soft">m</span>
                        </span>
                      )}
                    </div>
                    {e?.when && <FieldError>{conditionError(e.when)}</FieldError>}
                  </td>
                  <td className="px-2 py-1.5 text-right">
                    <Button variant="ghost" aria-label={`Remove rule ${n}`} onClick={() => remove(i)} className="px-2 text-ink-soft hover:text-danger">
                      ✕
                    </Button>
                  </td>
                </tr>
              );
            })}
            {fields.length === 0 && (
              <tr>
                <td colSpan={7} className="px-3 py-4 text-center text-ink-soft">
                  No rules: the BOM will list only the controller and modules.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </section>
  );
}
