/**
 * The admin API body adding an invented pilot chart: a small SVG of crates at two piers of Velmora
 * Isle, two options, `north` keyed, 30 responses wanted.
 */
export const pierPilotBody = (prompt = 'Which pier unloaded the most crates?') => ({
  prompt,
  alt: 'Bar chart of crates unloaded at two invented piers of Velmora Isle.',
  options: [
    { id: 'north', text: 'North pier' },
    { id: 'south', text: 'South pier' },
  ],
  key: 'north',
  image: {
    type: 'image/svg+xml',
    base64: Buffer.from(
      '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 120 60"><rect x="10" y="10" width="40" height="40" fill="#2a6f97"/></svg>',
    ).toString('base64'),
  },
  minResponses: 30,
});
