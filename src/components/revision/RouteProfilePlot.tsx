import { lazy, type ComponentProps } from 'react';
import { LoadedPart } from '../ui/LoadedPart';

// recharts is the largest library on the revision page; the plot's code arrives when a plot is
// first drawn, after the tables around it.
const RouteProfileChart = lazy(() => import('./RouteProfileChart'));

/** The route profile plot, its code fetched on first use. */
export default function RouteProfilePlot(props: ComponentProps<typeof RouteProfileChart>) {
  return (
    <div className="min-h-80">
      <LoadedPart loadingLabel="Loading the plot…">
        <RouteProfileChart {...props} />
      </LoadedPart>
    </div>
  );
}
