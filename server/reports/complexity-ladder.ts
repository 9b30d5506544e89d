import { chartTypePluralNames, joinList, taskLevelPhrases } from './chart-type-names.js';
import type { ProfileCell, TaskLevel } from './readability-profile.js';

/** Thresholds for the ladder's words; every report states the values it used. */
export interface LadderOptions {
  /** Share of the audience that must handle a cell for it to be within the reading ceiling (default 0.8). */
  readonly ceilingShare?: number;
}

/** How a share is put into words, from the top band down. */
export const shareBands = [
  { atLeast: 0.8, words: 'Most of this audience' },
  { atLeast: 0.6, words: 'Many in this audience' },
  { atLeast: 0.4, words: 'About half of this audience' },
  { atLeast: 0.2, words: 'Some of this audience' },
  { atLeast: 0, words: 'Few in this audience' },
] as const;

export interface ComplexityLadder {
  /** Cells from easiest to hardest by RP location. */
  readonly rungs: readonly ProfileCell[];
  /** The hardest cell that at least `ceilingShare` of the audience can handle; null if none. */
  readonly readingCeiling: ProfileCell | null;
  readonly ceilingShare: number;
  /** Plain sentences, one per share band that has cells, most capable band first. */
  readonly sentences: readonly string[];
}

/**
 * Orders profile cells by difficulty at the RP location, finds the reading ceiling, and writes
 * the result in sentences a team can act on. Under one normal ability distribution the share at
 * RP falls as the RP location rises, so the ceiling is the last rung whose share reaches the
 * threshold (common practice, no source: a direct consequence of the model).
 *
 * @example
 * complexityLadder(cells).sentences[0]; // "Most of this audience (80% or more) can read values from tables and bar charts."
 */
export function complexityLadder(
  cells: readonly ProfileCell[],
  options: LadderOptions = {},
): ComplexityLadder {
  const ceilingShare = options.ceilingShare ?? 0.8;
  const rungs = [...cells].sort(
    (a, b) => a.rpLocation - b.rpLocation || a.chartType.localeCompare(b.chartType),
  );
  let readingCeiling: ProfileCell | null = null;
  for (const rung of rungs) if (rung.shareAtRp >= ceilingShare) readingCeiling = rung;

  const sentences: string[] = [];
  const levels: TaskLevel[] = ['read', 'interpret', 'envision'];
  shareBands.forEach((band, index) => {
    const upper = index === 0 ? Number.POSITIVE_INFINITY : shareBands[index - 1]!.atLeast;
    const inBand = rungs.filter((cell) => cell.shareAtRp >= band.atLeast && cell.shareAtRp < upper);
    if (inBand.length === 0) return;
    const clauses = levels
      .map((level) => {
        const names = inBand.filter((c) => c.level === level).map((c) => chartTypePluralNames[c.chartType]);
        return names.length > 0 ? `${taskLevelPhrases[level]} ${joinList(names)}` : '';
      })
      .filter(Boolean);
    const range =
      index === 0
        ? `${Math.round(band.atLeast * 100)}% or more`
        : `${Math.round(band.atLeast * 100)}–${Math.round(upper * 100)}%`;
    sentences.push(`${band.words} (${range}) can ${joinList(clauses)}.`);
  });
  return { rungs, readingCeiling, ceilingShare, sentences };
}
