import type { HealthReport } from '@loadwright/contracts';

/** What the Overview knows about service health after the latest check. */
export type HealthReading =
  | { readonly state: 'checking' }
  | { readonly state: 'answered'; readonly report: HealthReport; readonly checkedAt: Date }
  | {
      readonly state: 'unreachable';
      readonly problem: string;
      readonly checkedAt: Date;
      /** The last report that did arrive, so the page can say how things stood then. */
      readonly lastReport: HealthReport | null;
    };

/** The overall verdict a planner reads first, with an icon that never carries meaning alone. */
export interface HealthVerdict {
  readonly tone: 'good' | 'warning' | 'problem' | 'pending';
  readonly icon: string;
  readonly headline: string;
  readonly detail: string;
}

/** One component's line on the Overview, e.g. "Database: connected". */
export interface ComponentLine {
  readonly ok: boolean;
  readonly icon: string;
  readonly text: string;
  readonly detail: string;
  readonly latency: string | null;
}

/** Summarises a reading as the headline at the top of the health section. */
export function verdictOf(reading: HealthReading): HealthVerdict {
  switch (reading.state) {
    case 'checking':
      return {
        tone: 'pending',
        icon: 'hourglass_empty',
        headline: 'Checking service health…',
        detail: 'Asking the Loadwright API for its status.',
      };
    case 'unreachable':
      return { tone: 'problem', icon: 'cloud_off', headline: 'API unreachable', detail: reading.problem };
    case 'answered':
      return reading.report.status === 'ok'
        ? {
            tone: 'good',
            icon: 'check_circle',
            headline: 'All services working',
            detail: 'The database and the job queue answered normally, and a worker is running.',
          }
        : {
            tone: 'warning',
            icon: 'warning',
            headline: 'Service degraded',
            detail: degradedDetail(failingComponents(reading.report)),
          };
  }
}

/** "The job queue is not working. …" for one failing component, "… are not working. …" for several. */
function degradedDetail(failing: readonly string[]): string {
  if (failing.length === 0) return 'The API reports a problem it did not attribute to the database, the job queue or the worker.';
  const subject = failing.length === 1 ? failing[0]! : `${failing.slice(0, -1).join(', ')} and ${failing[failing.length - 1]}`;
  const [verb, pronoun, recover] = failing.length === 1 ? ['is', 'it', 'recovers'] : ['are', 'they', 'recover'];
  return `${subject.charAt(0).toUpperCase()}${subject.slice(1)} ${verb} not working. Uploads, refits and forecasts may wait until ${pronoun} ${recover}.`;
}

/** Names of the components that reported a problem, in the order the page shows them. */
export function failingComponents(report: HealthReport): string[] {
  const failing: string[] = [];
  if (!report.database.ok) failing.push('the database');
  if (!report.queue.ok) failing.push('the job queue');
  // With the database down the worker check could not run: the database is the news, not the worker.
  if (!report.workers.ok && report.database.ok) failing.push('the worker');
  return failing;
}

/** Describes the database state in words, so colour and icon are never the only signal. */
export function databaseLine(report: HealthReport): ComponentLine {
  const { ok, detail, latencyMs } = report.database;
  return {
    ok,
    icon: ok ? 'check_circle' : 'error',
    text: ok ? 'Database: connected' : 'Database: not responding',
    // When all is well the API's own word repeats the state; say what was checked instead.
    detail: ok ? 'PostgreSQL answered a test query.' : detail,
    latency: formatLatency(latencyMs),
  };
}

/** Describes the job queue state in words, so colour and icon are never the only signal. */
export function queueLine(report: HealthReport): ComponentLine {
  const { ok, detail, latencyMs } = report.queue;
  return {
    ok,
    icon: ok ? 'check_circle' : 'error',
    text: ok ? 'Job queue: ready' : 'Job queue: unavailable',
    detail,
    latency: formatLatency(latencyMs),
  };
}

/** Describes the workers in words: how many run (by their heartbeats), or that none does. */
export function workersLine(report: HealthReport): ComponentLine {
  const { ok, detail, latencyMs, processes } = report.workers;
  const live = processes.filter((worker) => worker.live).length;
  return {
    ok,
    icon: ok ? 'check_circle' : 'error',
    text: ok ? `Workers: ${live} running` : report.database.ok ? 'Workers: none running' : 'Workers: unknown',
    detail,
    latency: formatLatency(latencyMs),
  };
}

/** "2.4 ms" for a measured round trip, null when the check did not complete. */
export function formatLatency(latencyMs: number | null): string | null {
  if (latencyMs === null) return null;
  return `${latencyMs < 10 ? latencyMs.toFixed(1) : Math.round(latencyMs)} ms`;
}
