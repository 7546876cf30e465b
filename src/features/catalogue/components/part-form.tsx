import { useMemo, useState, type ReactNode, type TextareaHTMLAttributes, type Ref } from 'react';
import { Controller, get, useFieldArray, useForm } from 'react-hook-form';
import { Link } from 'react-router';
import type { Maker, PartDetail, PartInputParsed } from '@shared/contracts/parts.ts';
import { LIFECYCLES, LIFECYCLE_LABELS, UNITS } from '@shared/contracts/parts.ts';
import { CATEGORY_CODES, CATEGORY_LABELS, type CategoryCode } from '@shared/contracts/part-attributes.ts';
import { FieldError, SelectField, TextField, optionsOf } from '@/components/ui/field.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { centsToDollars, dollarsToCents } from '@shared/domain/money.ts';
import { AttributeFields } from './attribute-fields.tsx';
import { emptyPartForm, formPaths, partFormResolver, partToForm, type PartFormValues } from './part-form-values.ts';

const UNIT_LABELS: Record<(typeof UNITS)[number], string> = { each: 'Each', pack: 'Pack', set: 'Set', m: 'Metre' };

const toNumber = (v: unknown) => (v === '' || v === null || v === undefined ? undefined : Number(v));
const toNullableNumber = (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v));

export interface PartFormProps {
  part?: PartDetail;
  makers: Maker[];
  /** May the actor see and set costs ('costs.view')? */
  withCost: boolean;
  saving: boolean;
  /** Sends the part; rejects with the server's error so field messages land on the form. */
  onSave: (input: PartInputParsed) => Promise<unknown>;
  cancelHref: string;
}

/** Create or change a part: common fields, the category's own fields, compliance, dangerous goods, supplier SKUs. */
export function PartForm({ part, makers, withCost, saving, onSave, cancelHref }: PartFormProps) {
  const [problem, setProblem] = useState<string | null>(null);
  const resolver = useMemo(() => partFormResolver(withCost), [withCost]);
  const form = useForm<PartFormValues, unknown, PartInputParsed>({ resolver, defaultValues: part ? partToForm(part) : emptyPartForm() });
  const { register, control, formState, watch, setValue, clearErrors } = form;
  const suppliers = useFieldArray({ control, name: 'supplierSkus' });
  const errors = formState.errors;
  const err = (path: string) => (get(errors, path) as { message?: string } | undefined)?.message;

  const category = watch('attributes.category');
  const lifecycle = watch('lifecycle');
  const nominalV = watch('attributes.nominalV') as number | undefined;
  const ratedAh = watch('attributes.ratedAh') as number | undefined;

  const submit = form.handleSubmit(async (input) => {
    setProblem(null);
    try {
      await onSave(input);
    } catch (e) {
      setProblem(applyServerErrors(e, form.setError, formPaths(form.getValues())));
    }
  });

  return (
    <form onSubmit={submit} noValidate aria-label={part ? `Edit ${part.sku}` : 'New part'} className="space-y-4">
      {Object.keys(errors).length > 0 && !problem && (
        <Notice tone="danger">Some fields need attention: each one says what to fix.</Notice>
      )}

      <Section title="Part">
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <TextField label="SKU" mono autoComplete="off" spellCheck={false} error={err('sku')} hint="Capitals, digits, dots, dashes or slashes." {...register('sku')} />
          <TextField label="Name" className="sm:col-span-2 lg:col-span-3" error={err('name')} {...register('name')} />
          <SelectField label="Maker" error={err('makerCode')} {...register('makerCode')}>
            <option value="">Choose a maker…</option>
            {makers.map((m) => (
              <option key={m.code} value={m.code}>
                {m.name} ({m.code})
              </option>
            ))}
          </SelectField>
          <SelectField
            label="Category"
            error={err('attributes.category')}
            hint={part ? 'Changing it clears the category fields below.' : undefined}
            value={category}
            onChange={(e) => {
              // A different category has different fields: start its attributes afresh.
              setValue('attributes', { category: e.target.value as CategoryCode }, { shouldDirty: true });
              clearErrors('attributes');
            }}
            options={optionsOf(CATEGORY_CODES, CATEGORY_LABELS)}
          >
            <option value="">Choose a category…</option>
          </SelectField>
          <TextField label="GTIN" mono inputMode="numeric" autoComplete="off" error={err('gtin')} hint="8, 12, 13 or 14 digits from the barcode; leave empty if none." {...register('gtin')} />
          <SelectField label="Lifecycle" error={err('lifecycle')} {...register('lifecycle')} options={optionsOf(LIFECYCLES, LIFECYCLE_LABELS)} />
          {lifecycle === 'superseded' && <TextField label="Superseded by (SKU)" mono autoComplete="off" error={err('supersededBySku')} {...register('supersededBySku')} />}
          <TextArea label="Description" className="sm:col-span-2 lg:col-span-4" rows={3} error={err('description')} {...register('description')} />
        </div>
      </Section>

      <Section title="Selling and size">
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <SelectField label="Sold as" error={err('unit')} {...register('unit')} options={optionsOf(UNITS, UNIT_LABELS)} />
          <TextField label="Pack size" mono type="number" step={1} min={1} error={err('packSize')} hint="Units in one sellable pack (feet: 4)." {...register('packSize', { setValueAs: toNumber })} />
          <Controller control={control} name="listPriceCents" render={({ field }) => <MoneyField label="List price ($, ex GST)" cents={field.value ?? null} onCents={field.onChange} onBlur={field.onBlur} error={err('listPriceCents')} />} />
          {withCost && (
            <Controller
              control={control}
              name="costCents"
              render={({ field }) => <MoneyField label="Cost ($, ex GST)" cents={field.value ?? null} onCents={field.onChange} onBlur={field.onBlur} error={err('costCents')} hint="Up to 4 decimals." />}
            />
          )}
          <TextField label="Mass (kg)" mono type="number" step="any" min={0} error={err('massKg')} {...register('massKg', { setValueAs: toNumber })} />
          <TextField label="Width (mm)" mono type="number" step={1} error={err('widthMm')} {...register('widthMm', { setValueAs: toNullableNumber })} />
          <TextField label="Height (mm)" mono type="number" step={1} error={err('heightMm')} {...register('heightMm', { setValueAs: toNullableNumber })} />
          <TextField label="Depth (mm)" mono type="number" step={1} error={err('depthMm')} {...register('depthMm', { setValueAs: toNullableNumber })} />
          <TextField label="IP rating" mono autoComplete="off" placeholder="IP55" error={err('ipRating')} {...register('ipRating')} />
        </div>
      </Section>

      <Section title={category ? `${CATEGORY_LABELS[category]} details` : 'Category details'} note={category ? 'Fields marked * are needed.' : undefined}>
        {category ? <AttributeFields key={category} category={category} form={form} /> : <p className="text-sm text-ink-soft">Choose a category above to see its fields.</p>}
      </Section>

      <Section title="Dangerous goods" note="Parts with lithium cells ship as Class 9 dangerous goods. Leave empty for everything else.">
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <SelectField label="UN number" error={err('dangerousGoods.unNumber')} {...register('dangerousGoods.unNumber')}>
            <option value="">Not dangerous goods</option>
            <option value="UN3480">UN3480 · lithium-ion batteries</option>
            <option value="UN3481">UN3481 · packed with or in equipment</option>
          </SelectField>
          <TextField label="Class" value="9" readOnly mono tabIndex={-1} hint="Always 9 for lithium batteries." />
          <div>
            <TextField label="Energy rating (Wh)" mono type="number" step="any" error={err('dangerousGoods.whRating')} {...register('dangerousGoods.whRating', { setValueAs: toNumber })} />
            {typeof nominalV === 'number' && typeof ratedAh === 'number' && !Number.isNaN(nominalV * ratedAh) && (
              <button
                type="button"
                className="mt-1 text-xs text-copper underline"
                onClick={() => setValue('dangerousGoods.whRating', Math.round(nominalV * ratedAh * 10) / 10, { shouldDirty: true, shouldValidate: formState.isSubmitted })}
              >
                Use {nominalV} V × {ratedAh} Ah
              </button>
            )}
          </div>
        </div>
        {err('dangerousGoods') && <FieldError>{err('dangerousGoods')}</FieldError>}
      </Section>

      <Section title="Compliance">
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <Controller
            control={control}
            name="compliance.standardsTestedTo"
            render={({ field }) => (
              <ListField label="Standards tested to" className="sm:col-span-2" value={field.value ?? []} onList={field.onChange} onBlur={field.onBlur} error={err('compliance.standardsTestedTo') ?? firstError(get(errors, 'compliance.standardsTestedTo'))} hint="Separate with commas, e.g. IEC 62619, UN 38.3" />
            )}
          />
          <TextField label="Certification listing" className="sm:col-span-2" error={err('compliance.certificationListing')} {...register('compliance.certificationListing')} />
          <TextField label="Certification date" type="date" error={err('compliance.certificationDate')} {...register('compliance.certificationDate')} />
          <TextField label="Enclosure rating" mono placeholder="IP55" error={err('compliance.enclosureIp')} {...register('compliance.enclosureIp')} />
          <SelectField
            label="Touch-safe connectors"
            error={err('compliance.touchSafeConnectors')}
            {...register('compliance.touchSafeConnectors', { setValueAs: (v: unknown) => (v === 'true' || v === true ? true : v === 'false' || v === false ? false : undefined) })}
          >
            <option value="">Not recorded</option>
            <option value="true">Yes</option>
            <option value="false">No</option>
          </SelectField>
        </div>
      </Section>

      <Section title="Supplier SKUs" note="The codes suppliers use for this part on their price lists and invoices; scanning one finds the part.">
        {suppliers.fields.length === 0 && <p className="mb-2 text-sm text-ink-soft">None recorded.</p>}
        <ul className="space-y-2">
          {suppliers.fields.map((row, i) => (
            <li key={row.id} className="grid items-start gap-3 sm:grid-cols-[12rem_16rem_auto]">
              <TextField label={`Supplier ${i + 1}`} mono placeholder="KESTREL" autoComplete="off" error={err(`supplierSkus.${i}.supplier`)} {...register(`supplierSkus.${i}.supplier`)} />
              <TextField label={`Supplier ${i + 1} SKU`} mono autoComplete="off" error={err(`supplierSkus.${i}.sku`)} {...register(`supplierSkus.${i}.sku`)} />
              <div className="pt-5">
                <Button variant="danger" onClick={() => suppliers.remove(i)}>
                  Remove<span className="sr-only"> supplier {i + 1}</span>
                </Button>
              </div>
            </li>
          ))}
        </ul>
        <Button className="mt-2" onClick={() => suppliers.append({ supplier: '', sku: '' })} disabled={suppliers.fields.length >= 20}>
          Add a supplier SKU
        </Button>
        {err('supplierSkus') && <FieldError>{err('supplierSkus')}</FieldError>}
      </Section>

      {problem && <Notice tone="danger">{problem}</Notice>}
      <div className="flex items-center gap-3 border-t border-line pt-3">
        <Button type="submit" variant="primary" disabled={saving}>
          {saving ? 'Saving…' : part ? 'Save changes' : 'Create part'}
        </Button>
        <Link to={cancelHref} className="text-sm text-ink-soft underline hover:text-ink">
          Cancel
        </Link>
      </div>
    </form>
  );
}

function firstError(v: unknown): string | undefined {
  if (!Array.isArray(v)) return undefined;
  return (v.find((e) => e?.message) as { message?: string } | undefined)?.message;
}

function Section({ title, note, children }: { title: string; note?: ReactNode; children: ReactNode }) {
  return (
    <section className="rounded-lg border border-line bg-card p-4">
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="font-semibold">{title}</h2>
        {note && <p className="text-xs text-ink-soft">{note}</p>}
      </div>
      {children}
    </section>
  );
}

function TextArea({ label, error, className = '', ...props }: { label: string; error?: string; ref?: Ref<HTMLTextAreaElement> } & TextareaHTMLAttributes<HTMLTextAreaElement>) {
  const id = `part-${props.name ?? 'text'}`;
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block text-xs font-semibold text-ink-soft">
        {label}
      </label>
      <textarea
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className="w-full rounded-md border border-line bg-card px-2.5 py-1.5 text-sm text-ink aria-[invalid=true]:border-danger"
        {...props}
      />
      {error && <FieldError id={`${id}-error`}>{error}</FieldError>}
    </div>
  );
}

/** Dollars in the box, cents in the form (a cost may carry fractions of a cent). */
function MoneyField({ label, cents, onCents, onBlur, error, hint }: { label: string; cents: number | null; onCents: (c: number | null) => void; onBlur: () => void; error?: string; hint?: string }) {
  const [text, setText] = useState(cents === null || cents === undefined || Number.isNaN(cents) ? '' : centsToDollars(cents));
  return (
    <TextField
      label={label}
      mono
      inputMode="decimal"
      autoComplete="off"
      value={text}
      error={error}
      hint={hint}
      onBlur={onBlur}
      onChange={(e) => {
        setText(e.target.value);
        // Unparseable text stays NaN, which the form refuses beside the field (never a blank).
        onCents(dollarsToCents(e.target.value));
      }}
    />
  );
}

/** A comma-separated list typed as text, held as an array. */
function ListField({ label, value, onList, onBlur, error, hint, className }: { label: string; value: string[]; onList: (v: string[]) => void; onBlur: () => void; error?: string; hint?: string; className?: string }) {
  const [text, setText] = useState(value.join(', '));
  return (
    <TextField
      label={label}
      className={className}
      value={text}
      error={error}
      hint={hint}
      onBlur={onBlur}
      onChange={(e) => {
        setText(e.target.value);
        onList(
          e.target.value
            .split(',')
            .map((s) => s.trim())
            .filter(Boolean),
        );
      }}
    />
  );
}

