import { CartesianGrid, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { useQuery } from '@tanstack/react-query';
import type { CaseResult } from '../../lib/calc/bonding/results';
import type { StoredCaseResult } from '../../lib/studies/stored-results';
import { formatQuantity } from '../../lib/format';
import { routeProfileQuery } from '../../lib/queries/revisions.queries';

const COLOURS = ['#a4522a', '#1f5f8b', '#2f6b3a', '#7a4ca0', '#b07d00', '#4a5668', '#c2185b', '#00796b', '#5d4037'];

export interface Measurement {
  chainageM: number;
  label: string;
  voltageV: number;
}

/**
 * Sheath and ECC voltage to earth along the route, with the limit and the link boxes marked.
 * Results stored without the profile (all but the oldest) fetch it when the plot is shown.
 */
export default function RouteProfileChart({ revisionId, result, limitV, measurements = [] }: { revisionId: string; result: StoredCaseResult; limitV: number | null; measurements?: Measurement[] }) {
  const fetched = useQuery({ ...routeProfileQuery(revisionId, result.caseId), enabled: !result.profile });
  const profile = result.profile ?? fetched.data?.profile;
  if (!profile) {
    return (
      <div data-testid="route-profile" className="flex h-80 w-full items-center justify-center text-sm text-ink-soft">
        {fetched.error ? <span role="alert">The route plot could not be drawn: {fetched.error.message}</span> : 'Drawing the route plot…'}
      </div>
    );
  }
  return <ProfileLines result={result} profile={profile} limitV={limitV} measurements={measurements} />;
}

function ProfileLines({ result, profile, limitV, measurements }: { result: StoredCaseResult; profile: CaseResult['profile']; limitV: number | null; measurements: Measurement[] }) {
  const data = profile.chainageM.map((x, i) => Object.fromEntries([['x', x], ...profile.series.map((s, k) => [`s${k}`, s.voltageV[i]])]));
  return (
    <div data-testid="route-profile" className="h-80 w-full">
      <ResponsiveContainer>
        <LineChart data={data} margin={{ top: 10, right: 20, bottom: 20, left: 10 }}>
          <CartesianGrid stroke="#e4dfd4" />
          <XAxis dataKey="x" type="number" domain={[0, 'dataMax']} unit=" m" label={{ value: 'distance along the route', position: 'insideBottom', offset: -10 }} />
          <YAxis unit=" V" domain={[0, (dataMax: number) => Math.ceil(Math.max(dataMax, (limitV ?? 0) * 1.1))]} />
          <Tooltip formatter={(v) => formatQuantity(Number(v), 'V')} labelFormatter={(x) => `${Number(x).toFixed(0)} m`} />
          <Legend verticalAlign="top" />
          {result.points.map((p) => <ReferenceLine key={`p${p.chainageM}`} x={p.chainageM} stroke="#c8c2b4" strokeDasharray="2 4" />)}
          {limitV !== null && <ReferenceLine y={limitV} stroke="#b3261e" strokeDasharray="8 6" label={{ value: `limit ${limitV} V (to local earth)`, fill: '#b3261e', position: 'insideTopLeft' }} />}
          {profile.series.map((s, k) => (
            <Line key={s.label} dataKey={`s${k}`} name={s.label} stroke={COLOURS[k % COLOURS.length]} dot={false} strokeWidth={2} isAnimationActive={false} connectNulls={false} strokeDasharray={s.kind === 'ecc' ? '3 3' : undefined} />
          ))}
          {measurements.length > 0 && (
            <Line data={measurements.map((m) => ({ x: m.chainageM, measured: m.voltageV }))} dataKey="measured" name="measured (scaled)" stroke="none" dot={{ r: 5, fill: '#16202e' }} isAnimationActive={false} />
          )}
        </LineChart>
      </ResponsiveContainer>
    </div>
  );
}
