import { ciede2000 } from './ciede2000.js';
import { contrastRatio } from './contrast-ratio.js';
import { formatHex } from './format-hex.js';
import { CONTRAST_THRESHOLDS, meetsContrast } from './meets-contrast.js';
import { parseColour } from './parse-colour.js';
import { simulateColourVision } from './simulate-colour-vision.js';
import { srgbToLab } from './srgb-to-lab.js';
import { COLOUR_VISION_DEFICIENCIES, type ColourVision, type Lab, type Rgb } from './types.js';

/**
 * Smallest CIEDE2000 difference at which two categorical colours count as distinguishable.
 *
 * Why 10 — common practice, no source: ΔE00 ≈ 1 is the usual figure for a just-noticeable
 * difference between large, adjacent patches under controlled viewing (from memory). Chart marks
 * are small, often not adjacent, viewed on uncalibrated phones and kiosks, and must be matched to a
 * legend entry rather than merely seen to differ, so an order of magnitude of margin is taken.
 * Stone, Szafir & Setlur (2014), "An engineering model for color difference as a function of
 * size" (Color and Imaging Conference 22) show that the difference needed grows as marks shrink;
 * only their abstract was read, no number is taken from it. ΔE00 was fitted to small
 * differences, so distances well above 10 rank pairs only roughly.
 */
export const MIN_CATEGORICAL_DIFFERENCE = 10;

/** Every vision checked: normal first, then the simulated dichromacies. */
const VISIONS: readonly ColourVision[] = ['normal', ...COLOUR_VISION_DEFICIENCIES];

export interface CategoricalColourOptions {
  /** ΔE00 below which a pair is reported; default {@link MIN_CATEGORICAL_DIFFERENCE}. */
  readonly minDifference?: number;
  /** Contrast each colour needs against the background; default 3 (WCAG 2.1 SC 1.4.11). */
  readonly minContrast?: number;
}

/** Two colours that fall below the difference threshold under one vision. */
export interface ConfusablePair {
  readonly vision: ColourVision;
  /** Indices into the input list, first < second. */
  readonly first: number;
  readonly second: number;
  /** The colours as given (normalised to `#rrggbb`). */
  readonly firstColour: string;
  readonly secondColour: string;
  /** The colours as simulated for this vision, `#rrggbb`. */
  readonly firstSeen: string;
  readonly secondSeen: string;
  /** ΔE00 between the simulated colours, unrounded. */
  readonly difference: number;
}

/** One colour's contrast against the background (normal vision). */
export interface BackgroundContrast {
  readonly index: number;
  readonly colour: string;
  /** WCAG 2.x contrast ratio, unrounded. */
  readonly ratio: number;
  readonly meetsThreshold: boolean;
}

/** An input colour that could not be read; `index` is -1 for the background. */
export interface UnreadableColour {
  readonly index: number;
  readonly text: string;
}

/** One line of the report, ready for the lint: which colours, and what is wrong. */
export interface ColourProblem {
  /** Indices into the colour list ([] for the background). */
  readonly indices: readonly number[];
  readonly problem: string;
}

export interface CategoricalColourReport {
  /** True when there are no problems. */
  readonly ok: boolean;
  readonly minDifference: number;
  readonly minContrast: number;
  /** Every pair below `minDifference`, for each vision in order normal, protan, deutan, tritan. */
  readonly confusablePairs: readonly ConfusablePair[];
  /** The contrast of every readable colour against the background (empty if it is unreadable). */
  readonly contrasts: readonly BackgroundContrast[];
  readonly unreadable: readonly UnreadableColour[];
  /**
   * Human-readable problems: one per unreadable colour, per colour below the contrast threshold,
   * and per confusable pair and vision (a pair confusable with normal vision is reported once).
   */
  readonly problems: readonly ColourProblem[];
}

/**
 * Checks a list of categorical colours drawn on one background: reports every pair whose
 * CIEDE2000 difference falls below the threshold under normal vision or under simulated
 * protanopia, deuteranopia or tritanopia (Machado et al. 2009, severity 1.0), and every colour
 * whose WCAG contrast against the background is below 3:1. Returns plain data and never throws
 * on bad colours: an unreadable colour becomes a problem and is left out of the comparisons.
 *
 * @see W3C WCAG 2.1 SC 1.4.11 Non-text Contrast (3:1 for graphical objects);
 *   Machado, Oliveira & Fernandes (2009), IEEE TVCG 15(6), 1291–1298 (simulation);
 *   Sharma, Wu & Dalal (2005), Color Research & Application 30(1), 21–30 (ΔE00).
 * @param colours the categorical colours, in legend order
 * @param background the colour the marks are drawn on
 * @param options thresholds; defaults ΔE00 10 and contrast 3
 * @returns the report; `ok` is true when `problems` is empty
 * @throws `checkCategoricalColours requires positive finite thresholds` for a bad option
 * @example
 * checkCategoricalColours(['#3050c0', '#8040c0'], '#ffffff').confusablePairs.map((pair) => pair.vision);
 * // ['protanopia', 'deuteranopia']
 */
export function checkCategoricalColours(
  colours: readonly string[],
  background: string,
  options: CategoricalColourOptions = {},
): CategoricalColourReport {
  const minDifference = options.minDifference ?? MIN_CATEGORICAL_DIFFERENCE;
  const minContrast = options.minContrast ?? CONTRAST_THRESHOLDS.graphicalObject;
  if (![minDifference, minContrast].every((value) => Number.isFinite(value) && value > 0)) {
    throw new Error('checkCategoricalColours requires positive finite thresholds');
  }
  const unreadable: UnreadableColour[] = [];
  const problems: ColourProblem[] = [];
  const readable: { index: number; rgb: Rgb; hex: string }[] = [];
  colours.forEach((text, index) => {
    const rgb = tryParse(text);
    if (rgb === undefined) {
      unreadable.push({ index, text });
      problems.push({ indices: [index], problem: `cannot read colour ${JSON.stringify(text)}` });
    } else {
      readable.push({ index, rgb, hex: formatHex(rgb) });
    }
  });
  const backgroundRgb = tryParse(background);
  if (backgroundRgb === undefined) {
    unreadable.push({ index: -1, text: background });
    problems.push({ indices: [], problem: `cannot read background colour ${JSON.stringify(background)}` });
  }

  const contrasts: BackgroundContrast[] = [];
  if (backgroundRgb !== undefined) {
    const backgroundHex = formatHex(backgroundRgb);
    for (const { index, rgb, hex } of readable) {
      const ratio = contrastRatio(rgb, backgroundRgb);
      const meetsThreshold = meetsContrast(ratio, minContrast);
      contrasts.push({ index, colour: hex, ratio, meetsThreshold });
      if (!meetsThreshold) {
        problems.push({
          indices: [index],
          problem: `${hex} has contrast ${ratio.toFixed(3)}:1 on ${backgroundHex} (needs >= ${minContrast}:1)`,
        });
      }
    }
  }

  const confusablePairs: ConfusablePair[] = [];
  // A pair already confusable with normal vision gets one problem line, not four.
  const confusedNormally = new Set<string>();
  for (const vision of VISIONS) {
    const seen = readable.map(({ rgb }) => simulateColourVision(rgb, vision));
    const labs: Lab[] = seen.map((rgb) => srgbToLab(rgb));
    for (let i = 0; i < readable.length; i++) {
      for (let j = i + 1; j < readable.length; j++) {
        const difference = ciede2000(labs[i]!, labs[j]!);
        if (difference >= minDifference) continue;
        const first = readable[i]!;
        const second = readable[j]!;
        confusablePairs.push({
          vision,
          first: first.index,
          second: second.index,
          firstColour: first.hex,
          secondColour: second.hex,
          firstSeen: formatHex(seen[i]!),
          secondSeen: formatHex(seen[j]!),
          difference,
        });
        const key = `${first.index},${second.index}`;
        if (vision === 'normal') confusedNormally.add(key);
        else if (confusedNormally.has(key)) continue;
        const under = vision === 'normal' ? 'with normal vision' : `under simulated ${vision}`;
        problems.push({
          indices: [first.index, second.index],
          problem: `${first.hex} and ${second.hex} differ by only ${difference.toFixed(1)} CIEDE2000 ${under} (needs >= ${minDifference})`,
        });
      }
    }
  }

  return {
    ok: problems.length === 0,
    minDifference,
    minContrast,
    confusablePairs,
    contrasts,
    unreadable,
    problems,
  };
}

function tryParse(text: string): Rgb | undefined {
  try {
    return parseColour(text);
  } catch {
    return undefined;
  }
}
