import type { z, ZodType } from 'zod';
import { FetchError } from '@/lib/swr/fetcher';
import {
  benchActionReplySchema,
  benchMeasureReplySchema,
  benchObserveReplySchema,
  benchStateSchema,
  type BenchAction,
  type BenchMeasureReply,
  type BenchObserveReply,
  type BenchState,
  type MeterMode,
} from '@/lib/validations/practice';

// What the bench screen asks of a bench session. The screen takes it as a prop, so the component
// tests drive it with a small fake and the page with the HTTP client below.
export interface BenchClient {
  state(): Promise<BenchState>;
  act(action: BenchAction, seconds?: number): Promise<{ time: number; sequenceState: string }>;
  measure(request: { mode: Exclude<MeterMode, 'udc'>; a: string; b: string } | { mode: 'udc'; series: string }): Promise<BenchMeasureReply>;
  /** Any observation of the bench (lib/bench/points.ts OBSERVATIONS): the spark, the flame, a look at a part. */
  observe(what: string): Promise<BenchObserveReply>;
  /** A gauge (manometer on the valve's taps, gap gauge), where the bench offers them (a practice attempt's). */
  gauge?(id: string): Promise<BenchMeasureReply>;
}

async function send<S extends ZodType>(url: string, schema: S, body?: unknown): Promise<z.output<S>> {
  const res = await fetch(url, {
    method: body === undefined ? 'GET' : 'POST',
    headers: { accept: 'application/json', ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
    credentials: 'same-origin',
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const data: unknown = await res.json().catch(() => null);
  if (!res.ok) {
    const error = (data as { error?: { message?: string; code?: string } } | null)?.error;
    throw new FetchError(error?.message ?? `The bench answered ${res.status}.`, res.status, error?.code);
  }
  const parsed = schema.safeParse(data);
  if (!parsed.success) throw new FetchError('The bench sent an answer this screen cannot read. Reload the page.', 500);
  return parsed.data;
}

/**
 * A bench over HTTP, at `base`: a session of the bench API (`/api/bench/sessions/{id}`) or the bench
 * of a practice attempt (`/api/practice/attempts/{id}/bench`); both answer the same four requests.
 */
export function httpBenchClient(base: string, { gauges = false }: { gauges?: boolean } = {}): BenchClient {
  return {
    state: () => send(base, benchStateSchema),
    act: (action, seconds) => send(`${base}/actions`, benchActionReplySchema, seconds === undefined ? { action } : { action, seconds }),
    measure: (request) => send(`${base}/measure`, benchMeasureReplySchema, request),
    observe: (what) => send(`${base}/observe`, benchObserveReplySchema, { what }),
    // Only a practice attempt's bench reads gauges (`{ mode: 'gauge', gauge }` on its measure).
    ...(gauges ? { gauge: (id: string) => send(`${base}/measure`, benchMeasureReplySchema, { mode: 'gauge', gauge: id }) } : {}),
  };
}
