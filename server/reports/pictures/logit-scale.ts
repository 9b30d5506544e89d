/** A linear map from logits to a pixel range, with whole-logit ticks. */
export interface LogitScale {
  (value: number): number;
  readonly domain: readonly [number, number];
  readonly ticks: readonly number[];
}

/**
 * A scale covering `values` (padded by half a logit, widened to whole logits) onto [from, to].
 * @example logitScale([-1.2, 0.4], 0, 100).domain // [-2, 1]
 */
export function logitScale(values: readonly number[], from: number, to: number): LogitScale {
  const finite = values.filter(Number.isFinite);
  const low = Math.floor(Math.min(...finite, -1) - 0.5);
  const high = Math.ceil(Math.max(...finite, 1) + 0.5);
  const scale = ((value: number) => from + ((value - low) / (high - low)) * (to - from)) as LogitScale;
  const ticks: number[] = [];
  for (let t = low; t <= high; t++) ticks.push(t);
  return Object.assign(scale, { domain: [low, high] as const, ticks });
}
