import { useId, type InputHTMLAttributes, type Ref } from 'react';
import { Controller, get, type UseFormReturn } from 'react-hook-form';
import type { PartInputParsed } from '@shared/contracts/parts.ts';
import { ATTRIBUTE_FIELDS, type AttributeField, type CategoryCode } from '@shared/contracts/part-attributes.ts';
import { FieldError, SelectField, TextField } from '@/components/ui/field.tsx';
import type { PartFormValues } from './part-form-values.ts';

type Form = UseFormReturn<PartFormValues, unknown, PartInputParsed>;

const toNumber = (v: unknown) => (v === '' || v === null || v === undefined ? undefined : Number(v));
const toText = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);

export const fieldLabel = (f: Pick<AttributeField, 'label' | 'unit' | 'required'>) => `${f.label}${f.unit ? ` (${f.unit})` : ''}${f.required ? ' *' : ''}`;

/** The chosen category's own fields, straight from ATTRIBUTE_FIELDS. */
export function AttributeFields({ category, form }: { category: CategoryCode; form: Form }) {
  const errors = form.formState.errors;
  const message = (key: string) => (get(errors, `attributes.${key}`) as { message?: string } | undefined)?.message;
  return (
    <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
      {ATTRIBUTE_FIELDS[category].map((f) => {
        const name = `attributes.${f.key}` as const;
        const error = message(f.key);
        const label = fieldLabel(f);
        switch (f.kind) {
          case 'number':
          case 'integer':
            if (f.options)
              return (
                <SelectField key={f.key} label={label} error={error} {...form.register(name, { setValueAs: toNumber })}>
                  <option value="">Not recorded</option>
                  {f.options.map((o) => (
                    <option key={o} value={o}>
                      {o}
                    </option>
                  ))}
                </SelectField>
              );
            return (
              <TextField key={f.key} label={label} error={error} mono type="number" step={f.kind === 'integer' ? 1 : 'any'} inputMode={f.kind === 'integer' ? 'numeric' : 'decimal'} {...form.register(name, { setValueAs: toNumber })} />
            );
          case 'text':
            return <TextField key={f.key} label={label} error={error} {...form.register(name, { setValueAs: toText })} />;
          case 'enum':
            return (
              <SelectField key={f.key} label={label} error={error} {...form.register(name, { setValueAs: toText })}>
                <option value="">{f.required ? 'Choose…' : 'Not recorded'}</option>
                {f.options?.map((o) => (
                  <option key={o} value={o}>
                    {o}
                  </option>
                ))}
              </SelectField>
            );
          case 'boolean':
            return <Checkbox key={f.key} label={label} error={error} {...form.register(name)} />;
          case 'list':
            return (
              <Controller
                key={f.key}
                control={form.control}
                name={name}
                render={({ field }) => <CheckboxGroup label={label} options={f.options ?? []} value={(field.value as string[] | undefined) ?? []} onChange={field.onChange} error={error} />}
              />
            );
        }
      })}
    </div>
  );
}

export function Checkbox({ label, error, ...props }: { label: string; error?: string } & InputHTMLAttributes<HTMLInputElement> & { ref?: Ref<HTMLInputElement> }) {
  const id = useId();
  return (
    <div className="flex flex-col justify-end">
      <label htmlFor={id} className="flex items-center gap-2 py-1.5 text-sm">
        <input id={id} type="checkbox" className="h-4 w-4 accent-copper" aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-error` : undefined} {...props} />
        {label}
      </label>
      {error && <FieldError id={`${id}-error`}>{error}</FieldError>}
    </div>
  );
}

function CheckboxGroup({ label, options, value, onChange, error }: { label: string; options: string[]; value: string[]; onChange: (v: string[]) => void; error?: string }) {
  const id = useId();
  return (
    <fieldset aria-describedby={error ? `${id}-error` : undefined} className="sm:col-span-2">
      <legend className="mb-1 text-xs font-semibold text-ink-soft">{label}</legend>
      <div className="flex flex-wrap gap-x-4 gap-y-1">
        {options.map((o) => (
          <label key={o} className="flex items-center gap-1.5 text-sm">
            <input
              type="checkbox"
              className="h-4 w-4 accent-copper"
              checked={value.includes(o)}
              onChange={(e) => onChange(e.target.checked ? options.filter((x) => x === o || value.includes(x)) : value.filter((x) => x !== o))}
            />
            {o}
          </label>
        ))}
      </div>
      {error && <FieldError id={`${id}-error`}>{error}</FieldError>}
    </fieldset>
  );
}
