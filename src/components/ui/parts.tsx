import type { ReactNode } from 'react';
import { ApiError } from '../../lib/queries/api-client';
import { STATE_LABEL, STATE_TONE } from './states';

export function StateBadge({ state }: { state: string }) {
  return <span className={`inline-block rounded border px-2 py-0.5 text-xs font-semibold ${STATE_TONE[state] ?? ''}`}>{STATE_LABEL[state] ?? state}</span>;
}

export function Button({ children, tone = 'primary', ...rest }: React.ButtonHTMLAttributes<HTMLButtonElement> & { tone?: 'primary' | 'plain' | 'danger' }) {
  const tones = {
    primary: 'bg-copper text-paper hover:bg-copper-dark',
    plain: 'border border-rule bg-panel text-ink hover:bg-copper-light',
    danger: 'border border-fail bg-panel text-fail hover:bg-fail/10',
  };
  return (
    <button type="button" {...rest} className={`rounded px-3 py-1.5 text-sm font-semibold disabled:cursor-not-allowed disabled:opacity-50 ${tones[tone]} ${rest.className ?? ''}`}>
      {children}
    </button>
  );
}

export function Empty({ children }: { children: ReactNode }) {
  return <p className="rounded border border-dashed border-rule bg-panel px-4 py-6 text-center text-ink-soft">{children}</p>;
}

/** Shows a failed request: the message, and each field the server named. */
export function ErrorNote({ error }: { error: unknown }) {
  if (!error) return null;
  const e = error instanceof ApiError ? error : null;
  return (
    <div role="alert" className="rounded border border-fail bg-fail/10 px-3 py-2 text-sm text-fail">
      <p>{e?.message ?? (error as Error).message}</p>
      {e?.fields.length ? (
        <ul className="mt-1 list-disc pl-5">
          {e.fields.map((f) => (
            <li key={f.field + f.message}>
              <code>{f.field}</code>: {f.message}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}

export function Busy({ label }: { label: string }) {
  return (
    <p role="status" className="flex items-center gap-2 text-sm text-ink-soft">
      <span className="inline-block h-4 w-4 animate-spin rounded-full border-2 border-copper border-t-transparent" />
      {label}
    </p>
  );
}

export function Caution() {
  return (
    <p className="rounded border-l-4 border-caution bg-caution/10 px-3 py-2 text-sm text-caution" data-testid="caution">
      These results support, and do not replace, the judgement of a competent engineer, the asset owner's standards and local regulations.
    </p>
  );
}

export function formatDate(d: string | Date) {
  return new Date(d).toISOString().slice(0, 16).replace('T', ' ');
}
