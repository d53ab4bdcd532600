// How a DSI control lets the technician read its flame signal without a meter in a lead: on a
// single-rod unit the one rod sparks and senses, so its lead carries the ~10 kV spark and a meter
// never goes in series there (TRADE.md: single-rod units; common practice, no source). The control
// then offers its own test, and which one depends on the control: test terminals that give a DC
// voltage following the flame current, or a status light read against the control's own legend.
//
// Plain data with no runtime imports: the built-in tree takes its bands from here, and the bench
// (lib/bench/bench.ts) models a control of one of these profiles. Every number below is from
// memory or common practice, no source: controls differ, and the control manufacturer's
// instructions and values come first. Tree steps built from a profile say so to the technician.
import type { Band } from '@/lib/trees/schema';

export type FlameTestMethodId = 'dc-test-terminals' | 'status-light';

export interface DcFlameTestProfile {
  id: 'dc-test-terminals';
  method: 'dc-volts';
  title: string;
  /** Where the meter leads go (the control's own test terminals, never the rod lead). */
  where: string;
  /**
   * DC volts at the test terminals per microamp of flame current. From memory: several controls
   * give about 1 VDC per µA at their test terminals; others scale differently.
   */
  voltsPerMicroamp: number;
  /** Below this (VDC) the control sees no flame. From memory, scaled from the µA bands. */
  noneBelow: number;
  /** Below this (VDC) the signal is low; at or above it, good. From memory, scaled from the ~2 µA "low" of TRADE.md. */
  lowBelow: number;
  /** How the values were come by, shown beside the bands. */
  provenance: 'from memory';
}

export interface StatusLightFlameTestProfile {
  id: 'status-light';
  method: 'status-light';
  title: string;
  where: string;
  /** What the technician records: the light's pattern as the control's own legend names it. */
  reads: string;
  provenance: 'common practice, no source';
}

export type FlameTestProfile = DcFlameTestProfile | StatusLightFlameTestProfile;

export const DC_TEST_TERMINALS: DcFlameTestProfile = {
  id: 'dc-test-terminals',
  method: 'dc-volts',
  title: 'Flame-signal test terminals (DC volts)',
  where: "the control's flame-signal test terminals (marked on the control or in its instructions)",
  voltsPerMicroamp: 1,
  noneBelow: 0.1,
  lowBelow: 2,
  provenance: 'from memory',
};

export const STATUS_LIGHT: StatusLightFlameTestProfile = {
  id: 'status-light',
  method: 'status-light',
  title: 'Status light against the control’s legend',
  where: "the control's status light and the legend printed on the control or in its instructions",
  reads: 'the pattern of the light, as the legend names it (flame good, flame weak, no flame)',
  provenance: 'common practice, no source',
};

export const FLAME_TEST_PROFILES: Record<FlameTestMethodId, FlameTestProfile> = {
  'dc-test-terminals': DC_TEST_TERMINALS,
  'status-light': STATUS_LIGHT,
};

/**
 * The bands of a measure step that reads a DC test-terminal profile: negative asks again (leads
 * reversed), then no flame, low and good, each to its outcome.
 */
export function dcFlameTestBands(profile: DcFlameTestProfile, outcomes: { none: string; low: string; good: string }): Band[] {
  return [
    {
      to: 0,
      label: 'Negative: meter leads reversed',
      verdict: 'below',
      askAgain:
        'A negative reading means the meter leads are reversed on the test terminals, not that there is no flame. Lock out, swap the leads, restore power and read again.',
    },
    { from: 0, to: profile.noneBelow, label: 'No flame signal at the test terminals', verdict: 'below', outcome: outcomes.none },
    { from: profile.noneBelow, to: profile.lowBelow, label: 'Low flame signal', verdict: 'below', outcome: outcomes.low },
    { from: profile.lowBelow, label: 'Good flame signal', verdict: 'within', outcome: outcomes.good },
  ];
}
