import clsx from 'clsx';

export type SignalWord = 'DANGER' | 'WARNING' | 'CAUTION' | 'NOTICE';

// ANSI Z535 signal-word panels: the safety colours are used here and nowhere else.
const PANEL: Record<SignalWord, string> = {
  DANGER: 'bg-z535-danger text-white',
  WARNING: 'bg-z535-warning text-black',
  CAUTION: 'bg-z535-caution text-black',
  NOTICE: 'bg-z535-notice text-white italic',
};

/** One caution: the signal word on its colour with the safety alert symbol (none for NOTICE), then the text. */
export function CautionNotice({ signal, text, compact = false }: { signal: SignalWord | string; text: string; compact?: boolean }) {
  const word = (signal in PANEL ? signal : 'CAUTION') as SignalWord;
  return (
    <div
      role="note"
      aria-label={`${word}: safety notice`}
      className={clsx('overflow-hidden rounded-lg border-2 border-black bg-raised print:break-inside-avoid', compact ? 'text-sm' : '')}
    >
      <p className={clsx('flex items-center gap-2 px-3 py-1 font-extrabold tracking-widest', PANEL[word])}>
        {word !== 'NOTICE' && (
          <span aria-hidden className="text-lg leading-none">
            ⚠
          </span>
        )}
        {word}
      </p>
      <p className={clsx('px-3 text-ink', compact ? 'py-1.5' : 'py-2')}>{text}</p>
    </div>
  );
}

export const DEFERRAL = "Follow local codes, the equipment manufacturer's instructions and licensed practice.";

/** The standing caution for any no-heat call on a DSI furnace. */
export const CALL_CAUTION = {
  signal: 'WARNING' as const,
  text: `This unit has line voltage (about 120 VAC) at its supply and a line-powered control, a high-voltage ignition spark (around 10 kV) at the igniter and its lead, and fuel gas at the valve and burners. Lock out before handling rods, leads or the burner; check for gas leaks before and after any work on the gas train. ${DEFERRAL}`,
};

export function CallCaution() {
  return <CautionNotice signal={CALL_CAUTION.signal} text={CALL_CAUTION.text} />;
}
