import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { revisionQuery } from '../../lib/queries/revisions.queries';
import type { WorkflowRole } from '../../lib/workflow/revision.machine';
import { withQueryClient } from '../ui/with-query-client';
import { Busy, ErrorNote, StateBadge } from '../ui/parts';
import { LoadedPart } from '../ui/LoadedPart';
import WorkflowBar from './WorkflowBar';
import RecordDownload from './RecordDownload';
import { BondingEditor, CheckValuesTab, ChecklistTab, ExploreTab, ExposureEditor, FilesTab, HistoryTab, JsonInputsEditor, RemarksTab, ResultsTab, TAB_CODE } from './workspace-tabs';

const TABS = ['Inputs', 'Inputs as JSON', 'Results', 'Checklist', 'Remarks', 'Check values', 'Files', 'History', 'Explore'] as const;
type Tab = (typeof TABS)[number];

/** The code a tab needs, fetched ahead when the pointer or focus reaches its button. */
function tabCode(tab: Tab, kind: string): () => Promise<unknown> {
  switch (tab) {
    case 'Inputs':
      return kind === 'bonding' ? TAB_CODE.bondingEditor : TAB_CODE.exposureEditor;
    case 'Inputs as JSON':
      return TAB_CODE.jsonEditor;
    case 'Results':
      return TAB_CODE.results;
    case 'Checklist':
      return TAB_CODE.checklist;
    case 'Remarks':
      return TAB_CODE.remarks;
    case 'Check values':
      return TAB_CODE.checkValues;
    case 'Files':
      return TAB_CODE.files;
    case 'History':
      return TAB_CODE.history;
    case 'Explore':
      return TAB_CODE.explore;
  }
}

function RevisionWorkspace({ revisionId, userId, roles }: { revisionId: string; userId: string; roles: WorkflowRole[] }) {
  const { data, isPending, error } = useQuery(revisionQuery(revisionId));
  const [tab, setTab] = useState<Tab | null>(null);
  if (isPending) return <Busy label="Loading the revision…" />;
  if (error) return <ErrorNote error={error} />;
  const r = data.revision;
  const editable = ['draft', 'returned'].includes(r.state) && r.designerId === userId;
  const participant = roles.some((x) => x !== 'auditor') && !['issued', 'withdrawn', 'superseded'].includes(r.state);
  const current: Tab = tab ?? (editable ? 'Inputs' : r.results ? 'Results' : 'Inputs');
  const openRemarks = data.remarks.filter((m) => !m.resolved).length;
  // A failed prefetch is not shown: opening the tab fetches again and reports the failure there.
  const prefetch = (t: Tab) => void tabCode(t, data.study.kind)().catch(() => undefined);

  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-start gap-4">
        <div>
          <p className="font-mono text-sm text-copper">{data.project.name}</p>
          <h1 className="text-display font-bold">{data.study.code} {data.study.title}</h1>
          <p className="flex items-center gap-2 text-sm">Revision {r.number} <StateBadge state={r.state} /> <a className="text-copper underline" href={`/studies/${data.study.id}`}>all revisions</a></p>
        </div>
        <div className="ml-auto"><RecordDownload revisionId={r.id} /></div>
      </header>
      <WorkflowBar detail={data} userId={userId} roles={roles} />
      <nav className="flex flex-wrap gap-1 border-b border-rule" role="tablist">
        {TABS.map((t) => (
          <button key={t} role="tab" aria-selected={current === t} type="button" onClick={() => setTab(t)} onPointerEnter={() => prefetch(t)} onFocus={() => prefetch(t)} className={`rounded-t px-3 py-1.5 text-sm ${current === t ? 'border border-b-0 border-rule bg-panel font-semibold' : 'text-ink-soft'}`}>
            {t}{t === 'Remarks' && openRemarks ? ` (${openRemarks} open)` : ''}
          </button>
        ))}
      </nav>
      <div role="tabpanel">
        <LoadedPart key={current} loadingLabel={`Loading the “${current}” tab…`}>
          {current === 'Inputs' && (data.study.kind === 'bonding' ? <BondingEditor key={r.version} detail={data} readOnly={!editable} /> : <ExposureEditor key={r.version} detail={data} readOnly={!editable} />)}
          {current === 'Inputs as JSON' && <JsonInputsEditor key={r.version} detail={data} readOnly={!editable} />}
          {current === 'Results' && <ResultsTab detail={data} />}
          {current === 'Checklist' && <ChecklistTab detail={data} userId={userId} roles={roles} />}
          {current === 'Remarks' && <RemarksTab detail={data} canWrite={participant} />}
          {current === 'Check values' && <CheckValuesTab detail={data} canAdd={r.state === 'in_check' && r.checkerId === userId} />}
          {current === 'Files' && <FilesTab detail={data} canUpload={participant} />}
          {current === 'History' && <HistoryTab revisionId={r.id} />}
          {current === 'Explore' && <ExploreTab detail={data} canRun={roles.includes('designer')} />}
        </LoadedPart>
      </div>
    </div>
  );
}

export default withQueryClient(RevisionWorkspace);
