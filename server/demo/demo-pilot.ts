/**
 * The demo's pilot chart: an INVENTED line chart of bike rentals at Orbelle Bikes, added to the demo
 * study in the bank's chart format (drawn by the server's renderer), with an INVENTED generating
 * difficulty for the simulated audience. Every simulated respondent meets it once at a random place in
 * their booklet, so the demo report's "Pilot charts" section shows a result for every cohort.
 */

/** Generating difficulty of the demo pilot, logits on the demo's scale (first cohort mean 0). Invented. */
export const demoPilotDifficulty = 0.5;

/** Answers the demo pilot needs before the report calibrates it (scaled with the demo's size). */
export function demoPilotMinResponses(sizeFactor = 1): number {
  return Math.max(30, Math.round(300 * sizeFactor));
}

/** The body of `POST /api/admin/studies/:studyId/pilots` for the demo pilot. */
export function demoPilotBody(sizeFactor = 1) {
  return {
    prompt: 'In which month did the shop first rent out more than 300 bikes?',
    alt: 'Line chart of bikes rented each month at Orbelle Bikes from March to August, on a scale from 0 to 500 bikes.',
    options: [
      { id: 'april', text: 'April' },
      { id: 'may', text: 'May' },
      { id: 'june', text: 'June' },
      { id: 'july', text: 'July' },
    ],
    key: 'may',
    chart: {
      type: 'line' as const,
      title: 'Bikes rented per month at Orbelle Bikes',
      fields: [
        {
          name: 'month',
          kind: 'ordinal' as const,
          label: 'Month',
          order: ['Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug'],
        },
        { name: 'rentals', kind: 'quantitative' as const, label: 'Bikes rented', unit: 'bikes' },
      ],
      data: [
        { month: 'Mar', rentals: 140 },
        { month: 'Apr', rentals: 260 },
        { month: 'May', rentals: 330 },
        { month: 'Jun', rentals: 290 },
        { month: 'Jul', rentals: 450 },
        { month: 'Aug', rentals: 410 },
      ],
      x: 'month',
      y: 'rentals',
      gridlines: true,
      valueAxis: { scale: 'linear' as const, domain: [0, 500] as [number, number], tickStep: 100 },
    },
    minResponses: demoPilotMinResponses(sizeFactor),
  };
}
