import type { QueryClient } from '@tanstack/react-query';
import { openEngineAlarmsQuery } from '../../alarms/api/alarms.api';
import { unitConversionsQuery } from '../../units/useUnits';
import { runAlarmsQuery, runBoardQuery, runDetailQuery, runReadingsQuery } from '../api/runs.api';

/**
 * The first answers of the live run page, asked for while its code is still on the way (the app opened straight on
 * /runs/:id: a link, a reload). The run, its board, readings and alarms go side by side; the run's answer carries its
 * engine's detail (left in the engine's cache entry), and the engine's open alarms follow it at once. The page then
 * finds them in the query cache. A failure here is left to the page's own queries, which ask again and show the error.
 */
export function preloadLiveRun(qc: QueryClient, runId: string): void {
  const quiet = (p: Promise<unknown>) => void p.catch(() => undefined);
  quiet(
    qc.fetchQuery(runDetailQuery(runId)).then((run) => {
      if (run.state !== 'closed' && run.state !== 'abandoned') quiet(qc.prefetchQuery(openEngineAlarmsQuery(run.engineId)));
    }),
  );
  quiet(qc.prefetchQuery(runBoardQuery(runId)));
  quiet(qc.prefetchQuery(runReadingsQuery(runId)));
  quiet(qc.prefetchQuery(runAlarmsQuery(runId)));
  quiet(qc.prefetchQuery(unitConversionsQuery()));
}
