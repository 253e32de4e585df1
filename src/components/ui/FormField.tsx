import { useId, type ReactNode } from 'react';

/** What a control needs to be named by its label and described by its error. */
export interface FieldControlProps {
  id: string;
  'aria-invalid': boolean;
  'aria-describedby': string | undefined;
}

/**
 * A labelled control with its error beside it. The error sits outside the `<label>`, so the
 * control's accessible name stays the label alone; it is tied to the control with
 * aria-describedby and marks it aria-invalid while it shows.
 */
export function FormField({ label, error, className, children }: { label: ReactNode; error?: string; className?: string; children: (control: FieldControlProps) => ReactNode }) {
  const id = useId();
  const errorId = `${id}-error`;
  return (
    <div className={className}>
      <label htmlFor={id}>{label}</label>
      {children({ id, 'aria-invalid': !!error, 'aria-describedby': error ? errorId : undefined })}
      {error && <span id={errorId} className="block max-w-72 text-xs text-fail">{error}</span>}
    </div>
  );
}
