import type { ItemInput } from '../../server/bank/item-schema.js';

/**
 * A valid read item (invented data) that tests copy and break one field at a time.
 * Bar chart of ferry passengers per day at an invented harbour; the key is the busiest day.
 */
export function validItem(): ItemInput {
  return {
    id: 'isle-ferry-busiest-day',
    scenario: 'isle',
    status: 'active',
    level: 'read',
    chart: {
      type: 'bar',
      title: 'Ferry passengers per day',
      fields: [
        { name: 'day', kind: 'ordinal', label: 'Day', order: ['Mon', 'Tue', 'Wed', 'Thu'] },
        { name: 'passengers', kind: 'quantitative', label: 'Passengers', unit: 'people' },
      ],
      data: [
        { day: 'Mon', passengers: 120 },
        { day: 'Tue', passengers: 340 },
        { day: 'Wed', passengers: 210 },
        { day: 'Thu', passengers: 90 },
      ],
      category: 'day',
      value: 'passengers',
      valueAxis: { scale: 'linear', domain: [0, 400] },
    },
    prompt: 'On which day did the most people take the ferry?',
    response: {
      kind: 'single-choice',
      options: [
        { id: 'a', text: 'Monday', value: 'Mon' },
        { id: 'b', text: 'Tuesday', value: 'Tue' },
        { id: 'c', text: 'Wednesday', value: 'Wed' },
        { id: 'd', text: 'Thursday', value: 'Thu' },
      ],
    },
    key: { by: 'query', query: { op: 'largest', field: 'passengers', by: 'day' } },
    alt: 'Bar chart of ferry passengers on four days, Monday to Thursday, on a scale from 0 to 400 people.',
    rationale: 'The Tuesday bar is the tallest; the other days stay below 250 people.',
    features: { distractorKinds: ['neighbour'] },
  };
}
