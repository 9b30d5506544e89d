/**
 * Short-text envision items, answered in the respondent's own words and scored later by people
 * against a three-level rubric (0, 1, 2). They reuse charts of the bar, line and scatter modules.
 */
import { harvest, harvestAlt } from './bar.js';
import type { Draft } from './draft.js';
import { memberships, membershipsAlt } from './line.js';
import { tomatoes, tomatoesAlt } from './scatter.js';

export const shortTextDrafts: readonly Draft[] = [
  {
    id: 'garden-harvest-bar-envision-2',
    scenario: 'garden',
    level: 'envision',
    chart: harvest,
    prompt:
      'The garden wants more food next year and can plant more of one crop. Besides this chart, what would you want to know before choosing, and why?',
    options: [],
    key: {
      rubric: [
        'Names nothing beyond the chart, or only picks the tallest bar.',
        'Names something more to find out (such as bed sizes, seed costs or other years) without saying how it would change the choice.',
        'Names something more to find out and says how it would change the choice, for example harvest per bed rather than in total, or whether this year was unusual.',
      ],
      maxLength: 300,
    },
    alt: harvestAlt,
    rationale:
      'The bars are one year of totals. A crop with a big total may simply have had the most space, and one year may be unusual, so a good choice needs harvest per area or several years.',
    distractors: [],
  },
  {
    id: 'science-members-line-envision-2',
    scenario: 'science-centre',
    level: 'envision',
    chart: memberships,
    prompt:
      'Family memberships grew every year. What other information could help explain why? Say how it would help.',
    options: [],
    key: {
      rubric: [
        'Gives nothing to look for, or only says again that family memberships grew.',
        'Names something to look at (such as prices, new exhibits or school holidays) without saying how it would explain the growth.',
        'Names something to look at and says how it could explain the growth, for example comparing the years before and after a change in family prices.',
      ],
      maxLength: 300,
    },
    alt: membershipsAlt,
    rationale:
      'The line shows when family memberships grew, not why. An explanation needs other facts that changed at the same time, checked against the years before and after.',
    distractors: [],
  },
  {
    id: 'garden-tomatoes-scatter-envision-2',
    scenario: 'garden',
    level: 'envision',
    chart: tomatoes,
    prompt:
      'Someone says the chart shows that more sun makes a plant give more tomatoes. What would you check before agreeing, and why?',
    options: [],
    key: {
      rubric: [
        'Agrees or disagrees without naming anything to check.',
        'Names something to check (such as water, soil or the kind of plant) without saying why it matters.',
        'Names something that could differ between sunny and shady plants and says it could explain the pattern instead of the sun, or describes a fair test.',
      ],
      maxLength: 300,
    },
    alt: tomatoesAlt,
    rationale:
      'Plants in the sunniest spots may also get more water or better soil. The points show that sun and harvest go together, not that sun alone causes the difference.',
    distractors: [],
  },
];
