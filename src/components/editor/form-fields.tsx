import type { FieldErrors } from 'react-hook-form';

/** Reads a nested value by a dotted path ("sections.2.lengthM"). */
export function atPath(obj: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o && typeof o === 'object' ? (o as Record<string, unknown>)[k] : undefined), obj);
}

export function FieldMessage({ errors, name }: { errors: FieldErrors; name: string }) {
  const e = atPath(errors, name) as { message?: string } | undefined;
  return e?.message ? <span className="block text-xs text-fail" role="alert">{e.message}</span> : null;
}

// Loose on purpose: one field component serves forms of different shapes.
type Reg = (name: any, options?: any) => object; // eslint-disable-line @typescript-eslint/no-explicit-any

/** A labelled input bound to the form; numbers are registered as numbers. */
export function Field({ register, errors, name, label, type = 'number', readOnly, hideLabel, className = 'w-24' }: { register: Reg; errors: FieldErrors; name: string; label: string; type?: 'number' | 'text'; readOnly?: boolean; hideLabel?: boolean; className?: string }) {
  const invalid = !!atPath(errors, name);
  return (
    <label className="block text-xs">
      <span className={hideLabel ? 'sr-only' : 'text-ink-soft'}>{label}</span>
      <input
        aria-label={label}
        aria-invalid={invalid}
        readOnly={readOnly}
        step="any"
        type={type}
        {...register(name, type === 'number' ? { valueAsNumber: true } : {})}
        className={`mt-0.5 block rounded border px-1 py-0.5 ${invalid ? 'border-fail' : 'border-rule'} ${className}`}
      />
      <FieldMessage errors={errors} name={name} />
    </label>
  );
}
