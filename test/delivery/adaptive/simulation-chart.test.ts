import { describe, expect, it } from 'vitest';
import { simulateAdaptive } from '../../../server/delivery/adaptive/simulate-adaptive.js';
import {
  describeSimulation,
  renderSimulationChart,
} from '../../../server/delivery/adaptive/simulation-chart.js';
import { spacedBank } from './helpers.js';

describe('renderSimulationChart', () => {
  const bank = spacedBank(['all'], 40);
  const result = simulateAdaptive({
    bank,
    audiences: [{ label: 'mean 0 <&>', mean: 0, sd: 1, persons: 30 }],
    settings: { seTarget: 0.5, minItems: 3, maxItems: 20, randomesque: 2 },
    seed: 1,
  });

  it('draws one bar per design and audience, one per used item, and a text alternative', () => {
    const svg = renderSimulationChart(result, {
      seTarget: 0.5,
      maxExposure: 0.3,
      subtitle: '40 invented items',
    });
    expect(svg.startsWith('<svg')).toBe(true);
    expect(svg).toContain('role="img"');
    expect(svg).toContain('<title id="sim-title">');
    expect(svg).toContain(
      `<desc id="sim-desc">${describeSimulation(result, 0.3).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')}</desc>`,
    );
    expect(svg).toContain('mean 0 &lt;&amp;&gt;');
    const used = Array.from(result.exposure).filter((r) => r > 0).length;
    const bars = (svg.match(/<rect /g) ?? []).length;
    // background + 5 design bars (adaptive, bound, three fixed forms) + 5 legend swatches + one bar per used item
    const audience = result.audiences[0]!;
    expect(Object.values(audience.fixed).every((form) => form !== null)).toBe(true);
    expect(bars).toBe(1 + 5 + 5 + used);
    expect(svg).toContain('>information bound (mean)</text>');
    expect(svg).toContain(`>${audience.bound!.items.toFixed(1)}</text>`);
    expect(renderSimulationChart(result, { seTarget: 0.5, maxExposure: 0.3, subtitle: 'x' })).toBe(
      renderSimulationChart(result, { seTarget: 0.5, maxExposure: 0.3, subtitle: 'x' }),
    );
  });
});
