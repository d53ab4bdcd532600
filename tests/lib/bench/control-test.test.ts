import { BenchRefusal, createBench, type Bench } from '@/lib/bench';
import { DC_TEST_TERMINALS } from '@/lib/trees/control-profiles';
import { DEFAULT_CONTROL_PROFILE } from '@/machines/ignition-sequence-machine';

// What the bench adds for the trees to be answerable: what one trial showed, and the control's own
// flame-signal test. The DSI sequence (spark, then the valve in a proving window, a flame proven or
// the valve closed) is common practice, no source (TRADE.md); the control's test terminals and their
// volts per microamp are a control profile's, from memory (lib/trees/control-profiles.ts).

const p = DEFAULT_CONTROL_PROFILE;
/** Seconds from the call to the end of the first flame-proving window and a little more. */
const PAST_FIRST_TRIAL_S = (p.prePurgeMs + p.sparkLeadMs + p.trialMs) / 1000 + 1;
const MID_TRIAL_S = (p.prePurgeMs + p.sparkLeadMs + p.trialMs / 2) / 1000;

function trialSeen(faultId: string | null): string {
  const b = createBench({ faultId, seed: 5 });
  b.act('power-on');
  b.act('call-for-heat');
  b.act('wait', PAST_FIRST_TRIAL_S);
  return b.observe('trial').result;
}

describe('what one trial shows', () => {
  it('tells the four outcomes of a trial apart', () => {
    expect(trialSeen(null)).toBe('stays-lit');
    expect(trialSeen('dirty-flame-rod')).toBe('lights-drops');
    expect(trialSeen('no-gas')).toBe('spark-no-flame');
    // A spark off the gap is still seen; one inside a broken lead is heard, not seen.
    expect(trialSeen('cracked-lead-insulation')).toBe('spark-no-flame');
    expect(trialSeen('broken-spark-lead')).toBe('no-spark');
    expect(trialSeen('control-not-sparking')).toBe('no-spark');
    expect(trialSeen('blown-fuse')).toBe('no-spark');
  });

  it('forgets the last trial when the call ends and starts again', () => {
    const b = createBench({ faultId: 'dirty-flame-rod', seed: 5 });
    b.act('power-on');
    b.act('call-for-heat');
    b.act('wait', PAST_FIRST_TRIAL_S);
    expect(b.observe('trial').result).toBe('lights-drops');
    b.act('end-call');
    b.act('call-for-heat');
    expect(b.observe('trial').result).toBe('no-spark');
  });
});

describe("the control's own flame-signal test", () => {
  const running = (faultId: string | null, flameTest?: 'dc-test-terminals' | 'status-light'): Bench => {
    const b = createBench({ faultId, seed: 9, unit: { ignition: 'single-rod' }, flameTest });
    b.act('power-on');
    b.act('call-for-heat');
    b.act('wait', MID_TRIAL_S);
    return b;
  };
  const volts = (b: Bench, a = 'flame-test-plus', c = 'flame-test-minus') => b.measure({ mode: 'vdc', a, b: c }).value!;

  it('gives DC volts that follow the flame current, per the profile, and negative with the leads reversed', () => {
    // The bench's healthy flame current is 4.2 µA; the profile's 1 VDC per µA makes about 4.2 VDC.
    const healthy = volts(running(null));
    expect(healthy).toBeGreaterThan(4.2 * DC_TEST_TERMINALS.voltsPerMicroamp * 0.95);
    expect(healthy).toBeLessThan(4.2 * DC_TEST_TERMINALS.voltsPerMicroamp * 1.05);
    expect(volts(running(null), 'flame-test-minus', 'flame-test-plus')).toBeLessThan(0);
    expect(volts(running('dirty-flame-rod'))).toBeLessThan(DC_TEST_TERMINALS.lowBelow);
    expect(volts(running('open-ground-lead'))).toBeLessThan(DC_TEST_TERMINALS.noneBelow);
    // No flame before the trial: nothing at the terminals.
    const idle = createBench({ seed: 9, unit: { ignition: 'single-rod' } });
    idle.act('power-on');
    expect(Math.abs(volts(idle))).toBeLessThan(DC_TEST_TERMINALS.noneBelow);
  });

  it('says which test the control provides, and refuses test terminals a status-light control does not have', () => {
    expect(running(null).observe('flame-test-method').result).toBe('dc-test-terminals');
    const light = running(null, 'status-light');
    expect(light.observe('flame-test-method').result).toBe('status-light');
    expect(() => volts(light)).toThrow(BenchRefusal);
    expect(light.observe('flame-test').result).toBe('good');
    // The meter still never goes in series on a single-rod unit.
    expect(() => light.measure({ mode: 'udc', series: 'flame-rod-lead' })).toThrow(/carries the spark/);
  });

  it("reads the control's valve output at the control, ahead of the wiring to the valve", () => {
    // A corroded valve return loses volts between the valve and the control common, not at the control's output.
    const b = createBench({ faultId: 'valve-wiring-resistance', seed: 2 });
    b.act('power-on');
    b.act('call-for-heat');
    b.act('wait', MID_TRIAL_S);
    const atControl = b.measure({ mode: 'vac', a: 'valve-out', b: 'control-common' }).value!;
    const atValve = b.measure({ mode: 'vac', a: 'valve-hot', b: 'valve-common' }).value!;
    expect(atControl).toBeGreaterThan(22);
    expect(atControl - atValve).toBeGreaterThan(2);
  });
});
