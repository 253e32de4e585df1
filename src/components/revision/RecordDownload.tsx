import { useState } from 'react';
import { parse } from 'content-disposition';
import { Busy, Button, ErrorNote } from '../ui/parts';

/** The download's name: the UTF-8 one (RFC 8187) where the header has it, else the plain one. */
function fileNameOf(disposition: string): string {
  try {
    return parse(disposition).parameters.filename || 'record.docx';
  } catch {
    return 'record.docx';
  }
}

/** Downloads the record; while the issued record is still being rendered, shows progress and retries. */
export default function RecordDownload({ revisionId, label = 'Download the record (.docx)' }: { revisionId: string; label?: string }) {
  const [state, setState] = useState<{ busy: boolean; note?: string; error?: Error; failed?: boolean }>({ busy: false });
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
        if (!res.ok) {
          const body = await res.json();
          setState({ busy: false, error: new Error(body.message), failed: body.error === 'RecordFailed' });
          return;
        }
        const name = fileNameOf(res.headers.get('content-disposition') ?? '');
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
  async function renderAgain() {
    setState({ busy: true, note: 'Asking for the record to be rendered again…' });
    const res = await fetch(`/api/revisions/${revisionId}/record`, { method: 'POST' });
    if (!res.ok) return setState({ busy: false, error: new Error((await res.json()).message), failed: true });
    await download();
  }
  return (
    <div className="flex flex-wrap items-center gap-3">
      <Button tone="plain" onClick={download} disabled={state.busy}>{label}</Button>
      {state.failed && <Button tone="plain" onClick={renderAgain} disabled={state.busy}>Render the record again</Button>}
      {state.busy ? <Busy label={state.note ?? ''} /> : state.note && <span className="text-sm text-ink-soft" data-testid="record-note">{state.note}</span>}
      {state.error && <ErrorNote error={state.error} />}
    </div>
  );
}
