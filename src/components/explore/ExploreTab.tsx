import { useState } from 'react';
import { Bar, BarChart, CartesianGrid, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { RevisionDetail } from '../../lib/queries/revisions.queries';
import type { Appraisal, SweepInput, Tornado } from '../../lib/calc/explore';
import type { PlacementResult, SweepResult } from '../../lib/explore/run-exploration';
import { api, ApiError } from '../../lib/queries/api-client';
import { readNumber } from '../../lib/paste/read-number';
import { SWEEP_LIMITS, gridPointCount } from '../../lib/calc/explore/sweep-limits';
import { explorationRequestSchema } from '../../lib/schemas/exploration.schema';
import { formatNumber } from '../../lib/format';
import { Button, Caution, ErrorNote } from '../ui/parts';
import { FormField } from '../ui/FormField';
import { issuesAsFields, placementFieldErrors, sweepFieldErrors, tornadoFieldErrors } from './explore-field-words';
import { useExploration, type ExplorationRow } from './use-exploration';
import { sweepCurves, sweepGrid } from '../../lib/explore/sweep-series';

// Design exploration tab: bonding options side by side, a sensitivity sweep with its progress
// and chart, and a tornado of the inputs. Charts drawn with recharts as RouteProfileChart does.

const INPUTS: Array<{ key: string; label: string; input: SweepInput; from: number; to: number }> = [
  { key: 'soil', label: 'Soil resistivity (Ω·m)', input: { kind: 'soil-resistivity' }, from: 20, to: 2000 },
  { key: 'spacing', label: 'Cable spacing (m)', input: { kind: 'phase-spacing' }, from: 0.1, to: 0.4 },
  { key: 'depth', label: 'Laying depth (m)', input: { kind: 'depth' }, from: 0.8, to: 2 },
  { key: 'load', label: 'Largest load current (A)', input: { kind: 'load-current' }, from: 200, to: 2000 },
  { key: 'fault', label: 'Largest fault current (A)', input: { kind: 'fault-current' }, from: 5000, to: 63000 },
  { key: 'linkbox', label: 'Earth resistance at link boxes (Ω)', input: { kind: 'earth-resistance', at: 'link-boxes' }, from: 1, to: 30 },
];

function Progress({ row, onCancel, canCancel }: { row: ExplorationRow<unknown>; onCancel: () => void; canCancel: boolean }) {
  if (row.status !== 'running') return row.status === 'failed' ? <p role="alert" className="text-sm text-fail">{row.error}</p> : row.status === 'cancelled' ? <p className="text-sm text-ink-soft">Cancelled.</p> : null;
  return (
    <div className="flex items-center gap-3">
      <progress data-testid="sweep-progress" max={row.total} value={row.done} className="h-3 w-64" aria-label="Grid points calculated" />
      <span className="text-sm" data-testid="sweep-count">{row.done} of {row.total} points</span>
      {canCancel && <Button tone="danger" onClick={onCancel}>Cancel</Button>}
    </div>
  );
}

/** The next round axis top: 1, 2, 2.5 or 5 times a power of ten. */
function niceCeiling(v: number): number {
  if (!(v > 0)) return 1;
  const p = 10 ** Math.floor(Math.log10(v));
  return [1, 2, 2.5, 5, 10].map((k) => k * p).find((c) => c >= v)!;
}

const fmt = (v: number | null | undefined, digits = 3) => (v === null || v === undefined ? '—' : formatNumber(Number(v.toPrecision(digits))));

function AppraisalPanel({ revisionId, canRun }: { revisionId: string; canRun: boolean }) {
  const job = useExploration<Appraisal>(revisionId);
  const [choice, setChoice] = useState('');
  const [reason, setReason] = useState('');
  const [chosen, setChosen] = useState<string | null>(null);
  const [choiceError, setChoiceError] = useState<unknown>(null);
  const rows = job.row?.result?.rows ?? [];
  const chart = rows.filter((r) => r.figures).map((r) => ({ name: r.key, standing: r.figures!.worstStandingV ?? 0, losses: r.figures!.lossesKwPerKm ?? 0 }));
  return (
    <section className="space-y-3" aria-labelledby="appraisal-h">
      <h2 id="appraisal-h" className="text-lg font-semibold">Bonding options</h2>
      {canRun && <Button onClick={() => job.start({ kind: 'appraisal' })} disabled={job.row?.status === 'running'}>Appraise the bonding options</Button>}
      <ErrorNote error={job.error} />
      {job.row && <Progress row={job.row} onCancel={job.cancel} canCancel={canRun} />}
      {rows.length > 0 && (
        <>
          <table className="w-full text-sm" data-testid="options-table">
            <thead><tr className="text-left"><th>Option</th><th>Standing V to local earth</th><th>λ1</th><th>Sheath losses kW/km</th><th>Fault V on sheath</th><th>Fault V across joint</th><th>SVL duty</th><th>Link boxes</th><th>Worst margin</th></tr></thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.key} className={r.isCurrent ? 'bg-copper-light font-semibold' : ''}>
                  <td>{r.label}{r.isCurrent ? ' (current)' : ''}{r.assumptions.length ? <span title={r.assumptions.join(' ')}> *</span> : null}</td>
                  {r.figures ? (
                    <>
                      <td>{fmt(r.figures.worstStandingV)} V</td><td>{fmt(r.figures.lossFactor)}</td><td>{fmt(r.figures.lossesKwPerKm)}</td><td>{fmt(r.figures.faultSheathV)} V</td><td>{fmt(r.figures.jointFaultV)} V</td>
                      <td>{r.figures.svlDutyPct === null ? 'no SVLs' : `${fmt(r.figures.svlDutyPct)} %`}</td><td>{r.figures.linkBoxes}</td><td className={r.figures.failing.length ? 'text-fail' : ''}>{fmt(r.figures.worstMarginPct)} %</td>
                    </>
                  ) : <td colSpan={8} className="text-ink-soft">{r.notAvailable}</td>}
                </tr>
              ))}
            </tbody>
          </table>
          <p className="text-xs text-ink-soft">* assumptions of the option: hover to read them. Options are derived from this revision's route, circuits and cases; nothing else changes.</p>
          <div className="h-64 w-full" data-testid="options-chart">
            <ResponsiveContainer>
              <BarChart data={chart} margin={{ top: 10, right: 20, bottom: 20, left: 10 }}>
                <CartesianGrid stroke="#e4dfd4" /><XAxis dataKey="name" /><YAxis yAxisId="v" unit=" V" /><YAxis yAxisId="kw" orientation="right" unit=" kW/km" />
                <Tooltip /><Legend verticalAlign="top" />
                <Bar yAxisId="v" dataKey="standing" name="standing voltage to local earth" fill="#a4522a" isAnimationActive={false} />
                <Bar yAxisId="kw" dataKey="losses" name="sheath losses" fill="#1f5f8b" isAnimationActive={false} />
              </BarChart>
            </ResponsiveContainer>
          </div>
          {canRun && job.row?.status === 'done' && (
            <div className="flex flex-wrap items-end gap-2">
              {!job.row.savedAt && <Button tone="plain" onClick={job.save}>Save the appraisal with the revision</Button>}
              {job.row.savedAt && (
                <>
                  <label className="text-sm">Chosen option <select value={choice} onChange={(e) => setChoice(e.target.value)} className="ml-1 border border-rule"><option value="">—</option>{rows.filter((r) => r.figures).map((r) => <option key={r.key} value={r.key}>{r.label}</option>)}</select></label>
                  <label className="text-sm">Reason <input value={reason} onChange={(e) => setReason(e.target.value)} className="ml-1 w-80 border border-rule px-1" /></label>
                  <Button onClick={async () => { setChoiceError(null); try { await api(`/api/revisions/${revisionId}/bonding-choice`, { method: 'PUT', body: { explorationId: job.row!.id, optionKey: choice, reason } }); setChosen(choice); } catch (e) { setChoiceError(e); } }}>Record the choice</Button>
                </>
              )}
              {chosen && <span className="text-sm">Choice recorded: {chosen}.</span>}
              <ErrorNote error={choiceError} />
            </div>
          )}
        </>
      )}
    </section>
  );
}

/** Curve colours, light to dark: the order of the second input's values reads off the shade. */
const CURVE_COLOURS = ['#e0a66a', '#c9824a', '#a4522a', '#7f3a1d', '#5b7fa6', '#1f5f8b', '#16406a', '#16202e'];

function SweepChart({ result }: { result: SweepResult }) {
  const criteria = [...new Set(result.points.flatMap((p) => (p.quantities ?? []).map((q) => q.criterion)))];
  const [criterion, setCriterion] = useState<string>(criteria.includes('standing-voltage-normal') ? 'standing-voltage-normal' : criteria[0]);
  const axis = result.axes[0];
  const second = result.axes[1];
  const { curves, secondCount, limit, unit } = sweepCurves(result, criterion);
  // One row per value of the first input, one column per curve.
  const data = (curves[0]?.points ?? []).map((p, i) => Object.fromEntries([['x', p.x], ...curves.map((c, k) => [`c${k}`, c.points[i]?.y ?? null])]));
  const fail = result.firstFailures.find((f) => f.criterion === criterion);
  const failText = fail && fail.values.map((v, k) => `${formatNumber(v)} (${result.axes[k].label})`).join(' with ');
  return (
    <div className="space-y-2">
      <label className="text-sm">Checked quantity <select value={criterion} onChange={(e) => setCriterion(e.target.value)} className="ml-1 border border-rule">{criteria.map((c) => <option key={c}>{c}</option>)}</select></label>
      {second && (
        <p className="text-xs text-ink-soft" data-testid="sweep-curves-note">
          One curve per value of {second.label}{curves.length < secondCount ? ` (${curves.length} of its ${secondCount} values, evenly spaced; the grid below and the record list every point)` : ''}.
        </p>
      )}
      <div className="h-72 w-full" data-testid="sweep-chart">
        <ResponsiveContainer>
          <LineChart data={data} margin={{ top: 10, right: 20, bottom: 20, left: 10 }}>
            <CartesianGrid stroke="#e4dfd4" />
            <XAxis dataKey="x" type="number" domain={['dataMin', 'dataMax']} label={{ value: axis.label, position: 'insideBottom', offset: -10 }} />
            <YAxis unit={unit ? ` ${unit}` : undefined} domain={[0, (m: number) => niceCeiling(Math.max(m, (limit ?? 0)) * 1.1)]} />
            <Tooltip />
            {second && <Legend verticalAlign="top" />}
            {limit !== null && <ReferenceLine y={limit} stroke="#b3261e" strokeDasharray="8 6" label={{ value: `limit ${limit} ${unit}`, fill: '#b3261e', position: 'insideTopLeft' }} />}
            {fail && <ReferenceLine x={fail.values[0]} stroke="#b3261e" label={{ value: `first fails at ${formatNumber(fail.values[0])}`, fill: '#b3261e', position: 'insideTopRight' }} />}
            {axis.baseValue !== null && <ReferenceLine x={axis.baseValue} stroke="#4a5668" strokeDasharray="2 4" label={{ value: 'current design', position: 'insideBottomLeft' }} />}
            {curves.map((c, k) => (
              <Line
                key={k}
                dataKey={`c${k}`}
                name={c.secondValue === null ? criterion : `${second!.label} = ${formatNumber(c.secondValue)}`}
                stroke={curves.length === 1 ? '#a4522a' : CURVE_COLOURS[Math.round((k * (CURVE_COLOURS.length - 1)) / Math.max(1, curves.length - 1))]}
                strokeWidth={2}
                dot={{ r: 2 }}
                isAnimationActive={false}
                connectNulls={false}
              />
            ))}
          </LineChart>
        </ResponsiveContainer>
      </div>
      {!fail && <p className="text-sm" data-testid="sweep-verdict">This check passes at every grid point.</p>}
      {fail && <p className="text-sm text-fail" data-testid="sweep-verdict">This check first fails at {failText}.</p>}
      {second && <SweepGridTable result={result} criterion={criterion} unit={unit} />}
    </div>
  );
}

/** Largest grid tabulated on the page; the record lists every point of any sweep. */
const GRID_TABLE_MAX = { first: 25, second: 40 };

/** The two-input grid as a table: the checked quantity at every point, failing cells marked. */
function SweepGridTable({ result, criterion, unit }: { result: SweepResult; criterion: string; unit: string }) {
  const [first, second] = result.axes;
  if (first.points > GRID_TABLE_MAX.first || second.points > GRID_TABLE_MAX.second) {
    return <p className="text-xs text-ink-soft">The grid ({first.points} × {second.points} points) is too large to tabulate here; the record lists every point.</p>;
  }
  const grid = sweepGrid(result, criterion);
  return (
    <div className="overflow-x-auto">
      <table className="text-xs" data-testid="sweep-grid" aria-label={`${criterion} over the grid${unit ? `, ${unit}` : ''}`}>
        <caption className="text-left text-ink-soft">{criterion}{unit ? ` (${unit})` : ''}: rows {second.label}, columns {first.label}; failing points marked ✗.</caption>
        <thead><tr><th scope="col">{second.label} ↓, {first.label} →</th>{grid.firstValues.map((x, i) => <th key={i} scope="col" className="px-1 text-right">{fmt(x, 4)}</th>)}</tr></thead>
        <tbody>
          {grid.rows.map((r, k) => (
            <tr key={k}>
              <th scope="row" className="px-1 text-right">{fmt(r.secondValue, 4)}</th>
              {r.cells.map((c, i) => (
                <td key={i} className={`px-1 text-right ${c.failing ? 'bg-fail/10 text-fail' : ''}`} title={c.error}>{c.error ? 'n/c' : `${fmt(c.value)}${c.failing ? ' ✗' : ''}`}</td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** A run the server refused field by field: its fields go beside the form's own, so no note lists them again. */
const refusedFields = (error: unknown) => (error instanceof ApiError && error.fields.length ? error.fields : null);

/** Under a form whose run was refused: the fields say why, or the refusal itself when it names none. */
const RefusalNote = ({ error }: { error: unknown }) => (refusedFields(error) ? <p role="alert" className="text-sm text-fail">The run was refused: see the fields marked.</p> : <ErrorNote error={error} />);

/** Text typed as a number (decimal point or comma); empty or unreadable is NaN, which the schema names. */
const typedNumber = (text: string) => {
  const r = readNumber(text);
  return 'value' in r ? r.value : NaN;
};

/** The axis of a sweep from the form's text fields. */
const axisOf = (key: string, from: string, to: string, points: string) => ({ input: INPUTS.find((i) => i.key === key)!.input, fromValue: typedNumber(from), toValue: typedNumber(to), points: typedNumber(points) });

const control = 'ml-1 w-24 border border-rule px-1';

/** The grid size as it is typed, and a warning when the server would refuse it. */
function GridCount({ total, error }: { total: number; error?: string }) {
  if (error) return <span className="text-sm text-fail" data-testid="sweep-grid-count">{error}</span>;
  // Only a whole count is a grid; a fraction is refused beside its field on Run.
  if (!Number.isInteger(total) || total <= 0) return null;
  const over = total > SWEEP_LIMITS.maxPoints;
  const count = `${total.toLocaleString('en-GB')} grid point${total === 1 ? '' : 's'}`;
  return (
    <span role={over ? 'alert' : undefined} className={over ? 'text-sm text-fail' : 'text-xs text-ink-soft'} data-testid="sweep-grid-count">
      {over ? `${count}: over the limit of ${SWEEP_LIMITS.maxPoints.toLocaleString('en-GB')}; use fewer points.` : `${count}.`}
    </span>
  );
}

function SweepPanel({ revisionId, canRun }: { revisionId: string; canRun: boolean }) {
  const job = useExploration<SweepResult>(revisionId);
  const [key, setKey] = useState(INPUTS[0].key);
  const [from, setFrom] = useState(String(INPUTS[0].from));
  const [to, setTo] = useState(String(INPUTS[0].to));
  const [points, setPoints] = useState('20');
  const [withSecond, setWithSecond] = useState(false);
  const [key2, setKey2] = useState(INPUTS[5].key);
  const [from2, setFrom2] = useState(String(INPUTS[5].from));
  const [to2, setTo2] = useState(String(INPUTS[5].to));
  const [points2, setPoints2] = useState('5');
  const [formErrors, setFormErrors] = useState<Record<string, string>>({});
  const pick = (k: string, setK: (v: string) => void, setF: (v: string) => void, setT: (v: string) => void) => {
    const n = INPUTS.find((i) => i.key === k)!;
    setK(n.key);
    setF(String(n.from));
    setT(String(n.to));
  };
  const axes = [axisOf(key, from, to, points), ...(withSecond ? [axisOf(key2, from2, to2, points2)] : [])];
  const totalPoints = gridPointCount(axes);
  // The server's refusal of a run, by field, beside the fields as the form's own are.
  const refused = refusedFields(job.error);
  const errors = { ...formErrors, ...(refused ? sweepFieldErrors(refused) : {}) };
  const field = (label: string, ariaLabel: string, path: string, value: string, set: (v: string) => void) => (
    <FormField className="text-sm" label={label} error={errors[path]}>
      {(c) => <input {...c} aria-label={ariaLabel} value={value} onChange={(e) => set(e.target.value)} className={control} />}
    </FormField>
  );
  return (
    <section className="space-y-3" aria-labelledby="sweep-h">
      <h2 id="sweep-h" className="text-lg font-semibold">Sensitivity sweep</h2>
      {canRun && (
        <form
          aria-label="Sweep settings"
          className="space-y-2"
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            // The request schema the server parses with: its refusals show beside the fields before anything is sent.
            const parsed = explorationRequestSchema.safeParse({ kind: 'sweep', axes });
            setFormErrors(parsed.success ? {} : sweepFieldErrors(issuesAsFields(parsed.error.issues)));
            if (parsed.success) void job.start(parsed.data);
          }}
        >
          <div className="flex flex-wrap items-start gap-2">
            <FormField className="text-sm" label="Input" error={errors['axes.0.input']}>
              {(c) => <select {...c} aria-label="Input" value={key} onChange={(e) => pick(e.target.value, setKey, setFrom, setTo)} className="ml-1 border border-rule">{INPUTS.map((i) => <option key={i.key} value={i.key}>{i.label}</option>)}</select>}
            </FormField>
            {field('From', 'From', 'axes.0.fromValue', from, setFrom)}
            {field('To', 'To', 'axes.0.toValue', to, setTo)}
            {field('Points', 'Points', 'axes.0.points', points, setPoints)}
          </div>
          <label className="flex items-center gap-1 text-sm"><input type="checkbox" checked={withSecond} onChange={(e) => setWithSecond(e.target.checked)} /> Vary a second input (one curve per value)</label>
          {withSecond && (
            <div className="flex flex-wrap items-start gap-2">
              <FormField className="text-sm" label="Second input" error={errors['axes.1.input'] ?? (key2 === key ? 'Second input — which input: pick an input other than the first.' : undefined)}>
                {(c) => <select {...c} aria-label="Second input" value={key2} onChange={(e) => pick(e.target.value, setKey2, setFrom2, setTo2)} className="ml-1 border border-rule">{INPUTS.filter((i) => i.key !== key).map((i) => <option key={i.key} value={i.key}>{i.label}</option>)}</select>}
              </FormField>
              {field('From', 'Second from', 'axes.1.fromValue', from2, setFrom2)}
              {field('To', 'Second to', 'axes.1.toValue', to2, setTo2)}
              {field('Points', 'Second points', 'axes.1.points', points2, setPoints2)}
            </div>
          )}
          <div className="flex items-center gap-2">
            <Button type="submit" disabled={job.row?.status === 'running' || (withSecond && key2 === key) || totalPoints > SWEEP_LIMITS.maxPoints}>Run the sweep</Button>
            <GridCount total={totalPoints} error={errors.axes} />
          </div>
        </form>
      )}
      <RefusalNote error={job.error} />
      {job.row && <Progress row={job.row} onCancel={job.cancel} canCancel={canRun} />}
      {job.row?.status === 'done' && job.row.result && (
        <>
          <SweepChart result={job.row.result} />
          <p className="text-xs text-ink-soft">Inputs hash {job.row.inputsHash.slice(0, 12)}…, engine {job.row.engineVersion}, {job.row.total} points.</p>
          {canRun && (job.row.savedAt ? <p className="text-sm" data-testid="sweep-saved">Saved with the revision.</p> : <Button tone="plain" onClick={job.save}>Save the sweep with the revision</Button>)}
        </>
      )}
    </section>
  );
}

function TornadoPanel({ revisionId, canRun }: { revisionId: string; canRun: boolean }) {
  const job = useExploration<Tornado>(revisionId);
  const [pct, setPct] = useState('20');
  const [formErrors, setFormErrors] = useState<Record<string, string>>({});
  const refused = refusedFields(job.error);
  const errors = { ...formErrors, ...(refused ? tornadoFieldErrors(refused) : {}) };
  const run = () => {
    const plusMinusPct = typedNumber(pct);
    const inputs: SweepInput[] = [{ kind: 'soil-resistivity' }, { kind: 'load-current' }, { kind: 'fault-current' }, { kind: 'earth-resistance', at: 'link-boxes' }, { kind: 'phase-spacing' }, { kind: 'depth' }];
    const parsed = explorationRequestSchema.safeParse({ kind: 'tornado', inputs: inputs.map((input) => ({ input, plusMinusPct })) });
    setFormErrors(parsed.success ? {} : tornadoFieldErrors(issuesAsFields(parsed.error.issues)));
    if (parsed.success) void job.start(parsed.data);
  };
  const t = job.row?.result;
  const data = (t?.bars ?? []).map((b) => ({ name: b.label, low: b.lowMarginPct === null || t!.baseMarginPct === null ? 0 : b.lowMarginPct - t!.baseMarginPct, high: b.highMarginPct === null || t!.baseMarginPct === null ? 0 : b.highMarginPct - t!.baseMarginPct }));
  return (
    <section className="space-y-3" aria-labelledby="tornado-h">
      <h2 id="tornado-h" className="text-lg font-semibold">Tornado: effect on the worst margin</h2>
      {canRun && (
        <div className="flex flex-wrap items-start gap-2">
          <FormField className="text-sm" label="± range, % of each input" error={errors.plusMinusPct}>
            {(c) => <input {...c} value={pct} onChange={(e) => setPct(e.target.value)} className="ml-1 w-16 border border-rule px-1" />}
          </FormField>
          <Button onClick={run} disabled={job.row?.status === 'running'}>Rank the inputs</Button>
          {errors.form && <span className="text-sm text-fail">{errors.form}</span>}
        </div>
      )}
      <RefusalNote error={job.error} />
      {job.row && <Progress row={job.row} onCancel={job.cancel} canCancel={canRun} />}
      {t && (
        <div className="h-72 w-full" data-testid="tornado-chart">
          <p className="text-sm">Worst margin of the current design: {fmt(t.baseMarginPct)} %. Bars: change in percentage points with each input at its low and high value.</p>
          <ResponsiveContainer>
            <BarChart layout="vertical" data={data} stackOffset="sign" margin={{ top: 10, right: 20, bottom: 20, left: 180 }}>
              <CartesianGrid stroke="#e4dfd4" /><XAxis type="number" unit=" pp" /><YAxis type="category" dataKey="name" width={170} />
              <Tooltip /><Legend verticalAlign="top" /><ReferenceLine x={0} stroke="#16202e" />
              <Bar dataKey="low" name="input low" fill="#1f5f8b" stackId="t" isAnimationActive={false} />
              <Bar dataKey="high" name="input high" fill="#a4522a" stackId="t" isAnimationActive={false} />
            </BarChart>
          </ResponsiveContainer>
        </div>
      )}
    </section>
  );
}

function PlacementPanel({ revisionId, canRun }: { revisionId: string; canRun: boolean }) {
  const job = useExploration<PlacementResult>(revisionId);
  const [drum, setDrum] = useState('800');
  const [windows, setWindows] = useState('');
  const [acceptError, setAcceptError] = useState<unknown>(null);
  const p = job.row?.result;
  const [formErrors, setFormErrors] = useState<Record<string, string>>({});
  const refused = refusedFields(job.error);
  const errors = { ...formErrors, ...(refused ? placementFieldErrors(refused) : {}) };
  const parseWindows = () =>
    windows.split(/[;\n]/).map((w) => w.trim()).filter(Boolean).map((w) => {
      const [fromM, toM] = w.split(/[-–]/).map((x) => typedNumber(x ?? ''));
      return { fromM, toM };
    });
  const run = () => {
    const parsed = explorationRequestSchema.safeParse({ kind: 'placement', drumLengthM: typedNumber(drum), windows: parseWindows() });
    setFormErrors(parsed.success ? {} : placementFieldErrors(issuesAsFields(parsed.error.issues)));
    if (parsed.success) void job.start(parsed.data);
  };
  return (
    <section className="space-y-3" aria-labelledby="placement-h">
      <h2 id="placement-h" className="text-lg font-semibold">Joint-bay placement</h2>
      {canRun && (
        <form aria-label="Placement settings" noValidate className="flex flex-wrap items-start gap-2" onSubmit={(e) => { e.preventDefault(); run(); }}>
          <FormField className="text-sm" label="Drum length limit (m)" error={errors.drumLengthM}>
            {(c) => <input {...c} aria-label="Drum length limit (m)" value={drum} onChange={(e) => setDrum(e.target.value)} className="ml-1 w-24 border border-rule px-1" />}
          </FormField>
          <FormField className="text-sm" label="Windows for joint bays, chainage m (e.g. 400-600; 900-1100; empty: anywhere)" error={errors.windows}>
            {(c) => <input {...c} aria-label="Windows" value={windows} onChange={(e) => setWindows(e.target.value)} className="ml-1 w-80 border border-rule px-1" />}
          </FormField>
          <Button type="submit" disabled={job.row?.status === 'running'}>Suggest joint positions</Button>
          {errors.form && <span className="text-sm text-fail">{errors.form}</span>}
        </form>
      )}
      <RefusalNote error={job.error} />
      {job.row && <Progress row={job.row} onCancel={job.cancel} canCancel={canRun} />}
      {p && (
        <>
          <p className="text-sm">Current design: worst standing voltage {fmt(p.current.worstStandingV)} V, λ1 {fmt(p.current.lossFactor)}. Suggested: {p.suggested ? `${fmt(p.suggested.worstStandingV)} V, λ1 ${fmt(p.suggested.lossFactor)}` : 'nothing fits the windows and drum length'}.</p>
          <table className="w-full text-sm" data-testid="placement-table">
            <thead><tr className="text-left"><th>Major section</th><th>Current minor lengths (m)</th><th>Suggested (m)</th><th>Residual share now</th><th>Suggested</th><th>Notes</th></tr></thead>
            <tbody>
              {p.placement.majorSections.map((m) => (
                <tr key={m.sectionIds.join()}>
                  <td>{m.sectionIds.join(', ')}</td><td>{m.currentLengthsM.map((v) => fmt(v, 5)).join(' / ')}</td><td>{m.suggestedLengthsM ? m.suggestedLengthsM.map((v) => fmt(v, 5)).join(' / ') : '—'}</td>
                  <td>{fmt(m.currentImbalancePct)} %</td><td>{m.suggestedImbalancePct === null ? '—' : `${fmt(m.suggestedImbalancePct)} %`}</td><td>{[...m.currentViolations, m.reason ?? ''].filter(Boolean).join(' ') || '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {canRun && job.row?.status === 'done' && (
            <div className="flex flex-wrap gap-2">
              {job.row.savedAt ? <p className="text-sm">Saved with the revision.</p> : <Button tone="plain" onClick={job.save}>Save the placement with the revision</Button>}
              {p.placement.suggestedStudy && (
                <Button onClick={async () => { setAcceptError(null); try { const next = await api<{ id: string }>(`/api/revisions/${revisionId}/explorations/${job.row!.id}/accept`, { method: 'POST' }); window.location.assign(`/revisions/${next.id}`); } catch (e) { setAcceptError(e); } }}>Accept into a new draft</Button>
              )}
            </div>
          )}
          <ErrorNote error={acceptError} />
        </>
      )}
    </section>
  );
}

export default function ExploreTab({ detail, canRun }: { detail: RevisionDetail; canRun: boolean }) {
  if (detail.study.kind !== 'bonding') return <p className="text-sm text-ink-soft">Design exploration is for bonding studies.</p>;
  return (
    <div className="space-y-8">
      <Caution />
      <AppraisalPanel revisionId={detail.revision.id} canRun={canRun} />
      <SweepPanel revisionId={detail.revision.id} canRun={canRun} />
      <TornadoPanel revisionId={detail.revision.id} canRun={canRun} />
      <PlacementPanel revisionId={detail.revision.id} canRun={canRun} />
    </div>
  );
}
