import { describe, expect, it } from 'vitest';
import { type ChartSpecOf, chartSpecSchema } from '../../server/charts/chart-spec.js';
import { renderNetworkChart } from '../../server/charts/network-chart.js';
import { byClass, findElements, num, parseSvg, textsOf } from '../helpers/svg.js';
import { networkSpec } from './fixtures/specs.js';

describe('renderNetworkChart', () => {
  it('draws nodes at stored positions and links with widths from the weight', () => {
    const root = parseSvg(renderNetworkChart(networkSpec));
    const nodes = byClass(root, 'mark node');
    const links = byClass(root, 'mark link');
    expect(nodes).toHaveLength(4);
    expect(links).toHaveLength(3);
    // Stored x 0.1 < 0.4 < 0.5 < 0.9 keeps its order on screen.
    const cx = (id: string) => num(nodes.find((node) => node.attributes['data-node'] === id)!, 'cx');
    expect(cx('ebb') < cx('moss') && cx('moss') < cx('kelp') && cx('kelp') < cx('rook')).toBe(true);
    // weights 30, 12, 5 on a 2..8 scale from 0 to 30
    expect(links.map((link) => num(link, 'stroke-width'))).toEqual([8, 4.4, 3]);
    expect(findElements(root, (element) => element.name === 'marker')).toHaveLength(1);
    expect(textsOf(root, 'node-label')).toEqual(['Ebb', 'Kelp', 'Rook', 'Moss']);
    expect(textsOf(root, 'legend-label')).toEqual(['Coast', 'Hills']);
  });

  it('fails on a link to an unknown node', () => {
    const spec = chartSpecSchema.parse({
      ...networkSpec,
      data: [{ from: 'ebb', to: 'nowhere' }],
    }) as ChartSpecOf<'network'>;
    expect(() => renderNetworkChart(spec)).toThrow('network link names unknown node nowhere');
  });
});
