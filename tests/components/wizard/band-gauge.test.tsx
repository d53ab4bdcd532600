import { render, screen } from '@testing-library/react';
import { BandGauge } from '@/components/wizard/band-gauge';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import type { MeasureStep } from '@/lib/trees/schema';

const secondary = DEFAULT_TREE_GRAPH.steps.find((s) => s.id === 'transformer-secondary') as MeasureStep;
const manifold = DEFAULT_TREE_GRAPH.steps.find((s) => s.id === 'manifold-pressure') as MeasureStep;

function position() {
  return Number(screen.getByTestId('gauge-marker').getAttribute('data-position'));
}

describe('band gauge', () => {
  // The default transformer-secondary bands: under 18 V below, 18–30 V within, 30 V and up above.
  it.each([
    [5, 'below', 'Below'],
    [24, 'within', 'Within'],
    [36, 'above', 'Above'],
  ] as const)('puts %s VAC %s, in words and with an icon', (value, verdict, word) => {
    render(<BandGauge step={secondary} value={value} unit="VAC" />);
    const line = screen.getByTestId('gauge-verdict');
    expect(line).toHaveAttribute('data-verdict', verdict);
    expect(line).toHaveTextContent(word);
    const band = secondary.bands.find((b) => b.verdict === verdict)!;
    expect(line).toHaveTextContent(band.label);
    expect(line).toHaveTextContent({ below: '▼', within: '●', above: '▲' }[verdict]);
  });

  it('places the marker by value: left of the band for a low reading, right for a high one', () => {
    const { unmount } = render(<BandGauge step={secondary} value={5} />);
    const low = position();
    unmount();
    const second = render(<BandGauge step={secondary} value={24} />);
    const mid = position();
    second.unmount();
    render(<BandGauge step={secondary} value={36} />);
    const high = position();
    expect(low).toBeLessThan(mid);
    expect(mid).toBeLessThan(high);
    // gaugeScale pads the 18–30 V span by half of it each side: 12 V to 36 V, so 24 V sits in the middle.
    expect(mid).toBeCloseTo(0.5, 3);
  });

  it('gives a text equivalent naming the reading, the verdict and the band range', () => {
    render(<BandGauge step={manifold} value={3.5} unit="inWC" caption="This reading" />);
    const img = screen.getByRole('img');
    expect(img).toHaveAccessibleName(/3\.5 inWC — Within: .+ \(3 inWC to 4 inWC\)/);
  });

  it('lists every band and marks the one the reading is in', () => {
    render(<BandGauge step={manifold} value={0.2} unit="inWC" />);
    const items = screen.getByRole('list', { name: 'Bands' }).querySelectorAll('li');
    expect(items).toHaveLength(manifold.bands.length);
    expect(items[0]).toHaveTextContent('this reading');
    expect(items[1]).not.toHaveTextContent('this reading');
  });

  it('shows the reading in the unit picked', () => {
    render(<BandGauge step={manifold} value={3.5} unit="Pa" />);
    // 3.5 inWC × 249.0889 Pa/inWC (NIST SP 811, conventional inch of water) = 871.8 Pa.
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent('872 Pa');
  });
});
