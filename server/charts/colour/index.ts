/** Colour science for the chart layer: parsing, WCAG contrast, colour-vision simulation, CIEDE2000. */
export {
  type BackgroundContrast,
  type CategoricalColourOptions,
  type CategoricalColourReport,
  type ColourProblem,
  type ConfusablePair,
  checkCategoricalColours,
  MIN_CATEGORICAL_DIFFERENCE,
  type UnreadableColour,
} from './check-categorical-colours.js';
export { ciede2000 } from './ciede2000.js';
export { colourDifference } from './colour-difference.js';
export { contrastRatio } from './contrast-ratio.js';
export { formatHex } from './format-hex.js';
export { linearToSrgb } from './linear-to-srgb.js';
export { CONTRAST_THRESHOLDS, meetsContrast } from './meets-contrast.js';
export { CATEGORICAL_PALETTE, CATEGORICAL_SAFE_COUNT, SEQUENTIAL_RAMP } from './palettes.js';
export { parseColour } from './parse-colour.js';
export { relativeLuminance } from './relative-luminance.js';
export { type ColourInput, resolveColour } from './resolve-colour.js';
export { simulateColourVision } from './simulate-colour-vision.js';
export { MACHADO_2009_MATRICES, simulateColourVisionLinear } from './simulate-colour-vision-linear.js';
export { srgbToLab } from './srgb-to-lab.js';
export { srgbToLinear } from './srgb-to-linear.js';
export {
  COLOUR_VISION_DEFICIENCIES,
  type ColourVision,
  type ColourVisionDeficiency,
  type Lab,
  type LinearRgb,
  type Rgb,
} from './types.js';
