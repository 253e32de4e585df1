import { useQuery } from '@tanstack/react-query';
import { Area, AreaChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { registerHistoryQuery } from '../../lib/queries/register.queries';
import { Busy, Empty, ErrorNote } from '../ui/parts';
import { STATUSES, STATUS_COLOUR } from './status-words';

/** Status counts per day from the daily snapshots, stacked. */
export default function StatusChart({ projectId }: { projectId?: string }) {
  const { data, isPending, error } = useQuery(registerHistoryQuery(projectId));
  if (error) return <ErrorNote error={error} />;
  if (isPending) return <Busy label="Loading the history…" />;
  const byDay = new Map<string, Record<string, number | string>>();
  for (const d of data.days) byDay.set(d.day, { ...(byDay.get(d.day) ?? { day: d.day }), [d.status]: d.count });
  const points = [...byDay.values()];
  if (!points.length) return <Empty>No daily snapshot yet: the register records its counts each morning (UTC).</Empty>;
  return (
    <figure data-testid="register-chart" className="rounded-lg border border-rule bg-panel p-3">
      <figcaption className="mb-2 text-sm font-semibold">Assets by status, per day (UTC)</figcaption>
      <ResponsiveContainer width="100%" height={220}>
        <AreaChart data={points}>
          <CartesianGrid strokeDasharray="3 3" />
          <XAxis dataKey="day" fontSize={12} />
          <YAxis allowDecimals={false} fontSize={12} />
          <Tooltip />
          <Legend />
          {STATUSES.map((s) => <Area key={s} type="stepAfter" dataKey={s} stackId="1" stroke={STATUS_COLOUR[s]} fill={STATUS_COLOUR[s]} isAnimationActive={false} />)}
        </AreaChart>
      </ResponsiveContainer>
    </figure>
  );
}
