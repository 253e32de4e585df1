import type { FieldErrors } from 'react-hook-form';
import { fieldInWords } from './field-words';

/** Every field error as "Length of section S2: …", in form order; each jumps to its field. */
export function flattenErrors(errors: FieldErrors, prefix = ''): Array<{ path: string; message: string }> {
  const out: Array<{ path: string; message: string }> = [];
  for (const [k, v] of Object.entries(errors ?? {})) {
    if (!v || k === 'ref') continue;
    const path = prefix ? `${prefix}.${k}` : k;
    const e = v as { message?: unknown; type?: unknown };
    if (typeof e.message === 'string' && e.message) out.push({ path, message: e.message });
    if (typeof v === 'object') out.push(...flattenErrors(v as FieldErrors, path).filter((x) => x.path !== path));
  }
  return out.filter((x, i, all) => all.findIndex((y) => y.path === x.path) === i);
}

/** Scrolls to the field of `path` (or the nearest enclosing one shown) and focuses its input. */
export function goToField(path: string) {
  const parts = path.split('.');
  for (let n = parts.length; n > 0; n--) {
    const el = document.querySelector(`[data-field="${CSS.escape(parts.slice(0, n).join('.'))}"], [data-error-for="${CSS.escape(parts.slice(0, n).join('.'))}"]`);
    if (el) {
      el.scrollIntoView({ block: 'center' });
      (el.querySelector('input, select, textarea') as HTMLElement | null)?.focus({ preventScroll: true });
      return;
    }
  }
}

export default function ErrorList({ errors, values }: { errors: FieldErrors; values: unknown }) {
  const list = flattenErrors(errors);
  if (!list.length) return null;
  return (
    <div role="alert" className="rounded border border-fail bg-fail/10 px-3 py-2 text-sm text-fail" data-testid="error-list">
      <p className="font-semibold">{list.length === 1 ? 'One field needs correcting' : `${list.length} fields need correcting`}:</p>
      <ul className="list-disc pl-5">
        {list.map((e) => (
          <li key={e.path}><button type="button" className="underline" onClick={() => goToField(e.path)}>{fieldInWords(e.path, values)}</button>: {e.message}</li>
        ))}
      </ul>
    </div>
  );
}
