/**
 * Every word a respondent reads, in one place, ready for translation. A translation is a copy of
 * this object with the same keys (`Strings` checks that). Placeholders in braces (`{current}`)
 * are filled in by the page script; keep them in translated text.
 *
 * Plain language: short sentences, everyday words, about a 12-year-old's reading level. Say
 * "chart" and "question", never "item", "score" or "logit".
 */
export const en = {
  lang: 'en',
  pageTitle: 'Chart questions',
  noScript: 'This page needs JavaScript. Please turn it on, or ask a member of staff for help.',
  loading: 'Loading…',

  // The start page (GET /)
  startHeading: 'Answer some chart questions',
  startIntro: 'Type the code you were given. It looks like KELP-42.',
  codeLabel: 'Your code',
  codeHint: 'Letters and numbers. Capitals or small letters are both fine.',
  codeSubmit: 'Go',

  // Welcome
  welcomeHeading: 'Welcome!',
  welcomeText:
    'We will show you some charts and ask a question about each one. It is not a test of you. We want to find out which charts are easy to read.',
  welcomeTime: 'It takes about 10 minutes. You can stop at any time.',
  startButton: 'Start',
  codeNotFound: 'We could not find this code. Please check it and try again.',
  studyClosed: 'This set of questions is closed now. Thank you for your interest!',
  backToStart: 'Type a different code',

  // Consent
  consentHeading: 'Before we start',
  consentQuestion: 'Are you happy to take part?',
  consentYes: 'Yes, I want to take part',
  consentNo: 'No, thank you',
  declinedHeading: 'No problem',
  declinedText: 'Thank you for stopping by. Nothing you did was saved.',

  // Background questions
  backgroundHeading: 'A little about you',
  backgroundIntro:
    'These questions help us understand the answers. You can always choose "I would rather not say".',
  preferNotToSay: 'I would rather not say',
  backgroundMissing: 'Please pick an answer for each question. "I would rather not say" is fine too.',
  continueButton: 'Next',

  // Questions about a chart
  progress: 'Chart {current} of {total}',
  progressLabel: 'How far you are',
  dontKnow: "I don't know",
  chooseOne: 'Pick one answer.',
  chooseAny: 'Pick every answer that fits.',
  numberLabel: 'Your answer',
  numberHint: 'Type a number.',
  numberRange: 'Type a number from {min} to {max}.',
  numberAtLeast: 'Type a number of at least {min}.',
  numberAtMost: 'Type a number of at most {max}.',
  textLabel: 'Your answer',
  textHint: 'Write a few words. You can use up to {maxLength} letters.',
  textCount: '{count} of {maxLength} letters used.',
  answerMissing: 'Please pick an answer first. If you are not sure, choose "I don\'t know".',
  numberInvalid: 'That is not a number we can read. Please type digits only, like 12 or 3.5.',
  numberOutOfRange: 'Please type a number from {min} to {max}.',
  textTooLong: 'That is a bit long. Please use {maxLength} letters or fewer.',
  nextButton: 'Next',
  finishButton: 'Finish',

  // Saving over a shaky network
  saving: 'Saving…',
  savingRetry: 'Saving… we will keep trying. You do not need to do anything.',
  saved: 'Saved.',
  problem: 'Something went wrong on our side. Please ask a member of staff for help.',
  sessionEnded: 'Your turn has ended. You can start again.',

  // End
  endHeading: 'Thank you!',
  endText: 'You have answered all the questions. Your answers help us make charts that are easier to read.',
  endSummary: 'You answered {answered} questions and read {chartsRead} charts correctly.',
  nextVisitor: 'Next visitor',
  nextVisitorSoon: 'This screen will reset for the next visitor in a moment.',
} as const;

/** The shape every translation has: the same keys, any text. */
export type Strings = { readonly [K in keyof typeof en]: string };
