import type { PathItem } from '@/machines/wizard-machine';
import { PhotoControl } from '@/components/photos/photo-control';
import { VERDICT_ICON, VERDICT_WORD } from '@/components/wizard/band-gauge';
import { formatEntry, OVER_RANGE_TEXT } from '@/lib/units';

/** A reading as it was entered: its unit and its precision ("120.4 VAC", "1 1/8 in"), or "OL (open circuit)". */
export function readingText(item: Pick<PathItem, 'quantity' | 'text' | 'unit' | 'overRange'>): string {
  if (item.overRange) return OVER_RANGE_TEXT;
  const typed = (item.text ?? '').trim();
  const shown = item.quantity && typed !== '' ? formatEntry(item.quantity, typed, item.unit) : null;
  if (shown) return shown;
  // Not a reading this app parses (an answer from an older version): show it as stored.
  return item.unit && !typed.includes(item.unit) ? `${typed} ${item.unit}` : typed;
}

function answerText(item: PathItem) {
  if (item.kind === 'measure') return <span className="font-mono">{readingText(item)}</span>;
  if (item.kind === 'inspect') return item.note ? `${item.choiceLabel ?? ''} — “${item.note}”` : (item.choiceLabel ?? '');
  if (item.kind === 'fact') return `${item.choiceLabel ?? ''} (from the unit record)`;
  return 'Done';
}

/** Readings and observations take photos; a checklist or a unit-record branch has nothing to show. */
const takesPhotos = (item: PathItem) => item.kind === 'measure' || item.kind === 'inspect';

/**
 * The answers given so far, oldest first; collapsed so the current step keeps the screen. With the
 * call's id, each reading and observation has its photos and an "Add photo" (once it is saved: the
 * server attaches a photo to a stored answer, by the client id the wizard made for it).
 */
export function PathSoFar({ items, callId }: { items: PathItem[]; callId?: string }) {
  if (items.length === 0) return null;
  return (
    <details className="rounded-lg border border-line bg-raised" data-testid="path-so-far">
      <summary className="flex min-h-touch cursor-pointer items-center px-4 font-semibold">Path so far ({items.length})</summary>
      <ol className="divide-y divide-line px-4 pb-2">
        {items.map((item, i) => (
          <li
            key={item.clientId}
            className="grid grid-cols-[2.5rem_minmax(0,1fr)] gap-x-2 py-2 sm:grid-cols-[2.5rem_minmax(0,1fr)_minmax(0,1fr)]"
          >
            <span className="font-mono text-base text-muted">{i + 1}.</span>
            <span className="font-medium">{item.stepTitle}</span>
            <span className="col-start-2 sm:col-start-3">
              {answerText(item)}
              {item.verdict && (
                <span className="ml-2 text-base">
                  <span aria-hidden>{VERDICT_ICON[item.verdict]} </span>
                  {VERDICT_WORD[item.verdict]}
                  {item.band ? ` — ${item.band}` : ''}
                </span>
              )}
              {!item.saved && <span className="ml-2 text-base italic text-muted">(not saved yet)</span>}
            </span>
            {callId && takesPhotos(item) && (
              <div className="col-start-2 mt-2 sm:col-end-4">
                <PhotoControl
                  callId={callId}
                  answerId={item.clientId}
                  subject={item.stepTitle}
                  compact
                  disabledReason={item.saved ? null : 'Photos once the answer is saved.'}
                />
              </div>
            )}
          </li>
        ))}
      </ol>
    </details>
  );
}
