import clsx from 'clsx';
import type { SignalWord } from '@/lib/trees/schema';

// ANSI Z535 signal-word panels: the word on its standard colour, the safety-alert symbol for
// personal-injury hazards (DANGER, WARNING, CAUTION), and the message on the page's own colours so
// it stays readable in both themes. These colours are used for nothing else in the app.
const SIGNAL_STYLE: Record<SignalWord, { panel: string; border: string; symbol: boolean }> = {
  DANGER: { panel: 'bg-z535-danger text-white', border: 'border-z535-danger', symbol: true },
  WARNING: { panel: 'bg-z535-warning text-black', border: 'border-z535-warning', symbol: true },
  CAUTION: { panel: 'bg-z535-caution text-black', border: 'border-z535-caution', symbol: true },
  NOTICE: { panel: 'bg-z535-notice text-white', border: 'border-z535-notice', symbol: false },
};

const DEFERRAL = "Follow local codes, the equipment manufacturer's instructions and licensed practice.";

export interface CautionProps {
  signal: SignalWord;
  text: string;
  /** "alert" announces it at once (a caution that appears on a new step); "note" is read in order. */
  role?: 'note' | 'alert';
  className?: string;
}

/** Every caution ends by deferring to codes, instructions and licensed practice; added when the text lacks it. */
export function withDeferral(text: string): string {
  return /local codes/i.test(text) ? text : `${text.trim()} ${DEFERRAL}`;
}

export function Caution({ signal, text, role = 'note', className }: CautionProps) {
  const style = SIGNAL_STYLE[signal];
  return (
    <div role={role} aria-label={signal} className={clsx('overflow-hidden rounded-lg border-4 bg-raised', style.border, className)}>
      <p className={clsx('flex items-center gap-2 px-4 py-1.5 text-lg font-extrabold uppercase tracking-wider', style.panel)}>
        {style.symbol && (
          <span aria-hidden className="text-xl leading-none">
            ⚠
          </span>
        )}
        {signal}
      </p>
      <p className="px-4 py-3 text-base font-medium leading-snug text-ink">{withDeferral(text)}</p>
    </div>
  );
}

export function CautionList({ cautions, role }: { cautions: readonly { signal: SignalWord; text: string }[]; role?: 'note' | 'alert' }) {
  if (cautions.length === 0) return null;
  return (
    <div className="space-y-3">
      {cautions.map((c, i) => (
        <Caution key={i} signal={c.signal} text={c.text} role={role} />
      ))}
    </div>
  );
}
