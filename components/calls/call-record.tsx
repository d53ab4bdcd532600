import { Time } from '@/components/ui/time-zone';

/** One line of a call's record, as the call page reads it. */
export interface CallRecordEvent {
  id: string;
  kind: 'closed' | 'referred' | 'reopened' | 'reassigned' | 'signed_off';
  at: Date | string;
  actorName: string | null;
  note: string | null;
  fromName: string | null;
  toName: string | null;
}

const ICONS: Record<CallRecordEvent['kind'], string> = { closed: '✓', referred: '↗', reopened: '↺', reassigned: '⇄', signed_off: '✔' };

function sentence(e: CallRecordEvent): string {
  const who = e.actorName ?? 'Someone';
  switch (e.kind) {
    case 'closed':
      return `${who} closed the call`;
    case 'referred':
      return `${who} referred the call`;
    case 'reopened':
      return `${who} reopened the call`;
    case 'reassigned':
      return `${who} gave the call ${e.fromName ? `from ${e.fromName} ` : ''}to ${e.toName ?? 'someone no longer with the company'}`;
    case 'signed_off':
      return `${who} signed off a finding`;
  }
}

/** Who referred, closed, reopened, reassigned and signed off, when, and why, oldest first. */
export function CallRecord({ events }: { events: CallRecordEvent[] }) {
  return (
    <ol className="space-y-3">
      {events.map((e) => (
        <li key={e.id} className="flex gap-3">
          <span aria-hidden className="w-6 shrink-0 pt-0.5 text-center font-mono font-bold">
            {ICONS[e.kind]}
          </span>
          <div>
            <p>
              <span className="font-semibold">{sentence(e)}</span>
              <span className="text-muted">
                {' · '}
                <Time value={e.at} />
              </span>
            </p>
            {e.note && <p className="whitespace-pre-line">“{e.note}”</p>}
          </div>
        </li>
      ))}
    </ol>
  );
}
