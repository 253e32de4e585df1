import type { ReactNode } from 'react';
import { useFormContext } from 'react-hook-form';
import { readNumber } from '../../lib/paste/read-number';
import { atPath } from './form-fields';

// Inputs bound to the surrounding react-hook-form (FormProvider). Each shows its own error in
// words beside it, and carries its path in data-field so the error list can scroll to it.

const inputClass = (invalid: boolean, width: string) => `mt-0.5 block rounded border px-1 py-0.5 ${invalid ? 'border-fail' : 'border-rule'} ${width}`;

/** The field's own error, beside it; gone as soon as the field is valid again. */
export function ErrorBeside({ name }: { name: string }) {
  const { formState } = useFormContext();
  const e = atPath(formState.errors, name) as { message?: string } | undefined;
  return e?.message ? <span className="block max-w-64 text-xs text-fail" role="alert" data-error-for={name}>{e.message}</span> : null;
}

/** Text typed as a number: a decimal point or comma; empty is "not given"; anything else NaN, so the schema names it. */
export function numberFromText(v: unknown): number | undefined {
  if (typeof v === 'number') return v;
  const r = readNumber(String(v ?? ''));
  return 'empty' in r ? undefined : 'value' in r ? r.value : NaN;
}

function Labelled({ label, hideLabel, children, name }: { label: string; hideLabel?: boolean; children: ReactNode; name: string }) {
  return (
    <label className="block text-xs" data-field={name}>
      <span className={hideLabel ? 'sr-only' : 'text-ink-soft'}>{label}</span>
      {children}
      <ErrorBeside name={name} />
    </label>
  );
}

export function Num({ name, label, hideLabel, width = 'w-24' }: { name: string; label: string; hideLabel?: boolean; width?: string }) {
  const { register, formState } = useFormContext();
  const invalid = !!atPath(formState.errors, name);
  return (
    <Labelled label={label} hideLabel={hideLabel} name={name}>
      <input aria-label={label} aria-invalid={invalid} inputMode="decimal" type="text" {...register(name, { setValueAs: numberFromText })} className={inputClass(invalid, width)} />
    </Labelled>
  );
}

export function Text({ name, label, hideLabel, width = 'w-24', readOnly }: { name: string; label: string; hideLabel?: boolean; width?: string; readOnly?: boolean }) {
  const { register, formState } = useFormContext();
  const invalid = !!atPath(formState.errors, name);
  return (
    <Labelled label={label} hideLabel={hideLabel} name={name}>
      <input aria-label={label} aria-invalid={invalid} type="text" readOnly={readOnly} {...register(name)} className={inputClass(invalid, width)} />
    </Labelled>
  );
}

/** A choice; `numeric` stores the option values as numbers. */
export function Choice({ name, label, options, numeric, hideLabel }: { name: string; label: string; options: Array<[string | number, string]>; numeric?: boolean; hideLabel?: boolean }) {
  const { register, formState } = useFormContext();
  const invalid = !!atPath(formState.errors, name);
  return (
    <Labelled label={label} hideLabel={hideLabel} name={name}>
      <select aria-label={label} aria-invalid={invalid} {...register(name, numeric ? { setValueAs: (v) => Number(v) } : {})} className={inputClass(invalid, '')}>
        {options.map(([v, text]) => <option key={String(v)} value={v}>{text}</option>)}
      </select>
    </Labelled>
  );
}

export function Check({ name, label }: { name: string; label: string }) {
  const { register } = useFormContext();
  return (
    <label className="flex items-center gap-1 text-xs" data-field={name}>
      <input type="checkbox" aria-label={label} {...register(name)} /> {label}
      <ErrorBeside name={name} />
    </label>
  );
}

export const box = 'rounded-lg border border-rule bg-panel p-3';

/** Title, frequency and soil resistivity: the first row of every study form. */
export function StudyBasics() {
  return (
    <div className="flex flex-wrap gap-3">
      <Text name="title" label="Title" width="w-80" />
      <Choice name="frequencyHz" label="Frequency" numeric options={[[50, '50 Hz'], [60, '60 Hz']]} />
      <Num name="soilResistivityOhmM" label="Soil resistivity (Ω·m)" />
    </div>
  );
}
