import { useState } from 'react';
import { Busy, Button, ErrorNote } from '../ui/parts';

/** Downloads the record; while the issued record is still being rendered, shows progress and retries. */
export default function RecordDownload({ revisionId, label = 'Download the record (.docx)' }: { revisionId: string; label?: string }) {
  const [state, setState] = useState<{ busy: boolean; note?: string; error?: Error }>({ busy: false });
  async function download() {
    setState({ busy: true, note: 'Preparing the record…' });
    try {
      for (let attempt = 0; attempt < 60; attempt++) {
        const res = await fetch(`/api/revisions/${revisionId}/record`);
        if (res.status === 202) {
          setState({ busy: true, note: 'The issued record is being rendered…' });
          await new Promise((r) => setTimeout(r, 1000));
          continue;
        }
        if (!res.ok) throw new Error((await res.json()).message);
        const name = /filename="([^"]+)"/.exec(res.headers.get('content-disposition') ?? '')?.[1] ?? 'record.docx';
        const url = URL.createObjectURL(await res.blob());
        const a = Object.assign(document.createElement('a'), { href: url, download: name });
        a.click();
        URL.revokeObjectURL(url);
        setState({ busy: false, note: `Downloaded ${name}${res.headers.get('x-record-draft') === 'true' ? ' (draft)' : `, SHA-256 ${res.headers.get('x-record-sha256')?.slice(0, 12)}…`}` });
        return;
      }
      throw new Error('The record is taking unusually long; try again in a minute.');
    } catch (error) {
      setState({ busy: false, error: error as Error });
    }
  }
  return (
    <div className="flex flex-wrap items-center gap-3">
      <Button tone="plain" onClick={download} disabled={state.busy}>{label}</Button>
      {state.busy ? <Busy label={state.note ?? ''} /> : state.note && <span className="text-sm text-ink-soft" data-testid="record-note">{state.note}</span>}
      {state.error && <ErrorNote error={state.error} />}
    </div>
  );
}
