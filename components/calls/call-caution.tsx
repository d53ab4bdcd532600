import { Caution } from '@/components/ui/caution';

/** The standing caution for any no-heat call on a DSI furnace, shown before anyone opens the cabinet. */
export const CALL_CAUTION = {
  signal: 'WARNING' as const,
  text: 'This unit has line voltage (about 120 VAC) at its supply and at a line-powered control, a high-voltage ignition spark (around 10 kV) at the igniter and its lead, and fuel gas at the valve and burners. Lock out before handling rods, leads or the burner; check for gas leaks before and after any work on the gas train.',
};

export function CallCaution() {
  return <Caution signal={CALL_CAUTION.signal} text={CALL_CAUTION.text} />;
}
