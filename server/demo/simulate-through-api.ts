import type { ItemBank } from '../bank/load-bank.js';
import type { SeededRandom } from '../scoring/seeded-random.js';
import { simulateAnswer } from './simulated-audience.js';

/** A JSON call to the running server; throws with the answer's message on a non-2xx status. */
export async function callApi(
  baseUrl: string,
  method: 'GET' | 'POST',
  path: string,
  body?: unknown,
  token?: string,
): Promise<Record<string, unknown>> {
  const response = await fetch(`${baseUrl}${path}`, {
    method,
    headers: {
      ...(body === undefined ? {} : { 'content-type': 'application/json' }),
      ...(token === undefined ? {} : { authorization: `Bearer ${token}` }),
    },
    ...(body === undefined ? {} : { body: JSON.stringify(body) }),
  });
  const answer = (await response.json()) as Record<string, unknown>;
  if (!response.ok) {
    const error = answer.error as { message?: string } | undefined;
    throw new Error(`${method} ${path}: ${response.status} ${error?.message ?? ''}`);
  }
  return answer;
}

interface AttemptView {
  step: string;
  item?: { itemId: string; options?: { id: string }[] };
}

/**
 * One simulated respondent through the real respondent API: join with the cohort's code, agree, then
 * answer the background questions (`background`, when the study asks), then each question the server
 * shows until it says finished. Right answers are the key's options;
 * a wrong answer is an option outside the key; "I don't know" is sent as its own answer kind.
 *
 * @returns the number of answers sent
 */
export async function simulateRespondent(
  baseUrl: string,
  joinCode: string,
  ability: number,
  difficultyOf: ReadonlyMap<string, number>,
  bank: ItemBank,
  random: SeededRandom,
  background: Readonly<Record<string, string>> = {},
  /** Pilot charts of the study: generating difficulty and keyed option (they are not in the bank). */
  pilots: ReadonlyMap<string, { readonly difficulty: number; readonly key: string }> = new Map(),
): Promise<number> {
  const joined = await callApi(baseUrl, 'POST', '/api/join', { code: joinCode });
  const token = joined.token as string;
  let state = (await callApi(
    baseUrl,
    'POST',
    '/api/attempt/consent',
    { agree: true },
    token,
  )) as unknown as AttemptView;
  if (state.step === 'background') {
    state = (await callApi(
      baseUrl,
      'POST',
      '/api/attempt/background',
      { answers: background },
      token,
    )) as unknown as AttemptView;
  }
  let answers = 0;
  while (state.step === 'item' && state.item) {
    const itemId = state.item.itemId;
    const pilot = pilots.get(itemId);
    const bankItem = bank.byId.get(itemId);
    const difficulty = pilot?.difficulty ?? difficultyOf.get(itemId);
    if ((!bankItem && !pilot) || difficulty === undefined)
      throw new Error(`demo: item ${itemId} is not in the demo's bank`);
    const outcome = simulateAnswer(random, ability, difficulty);
    const keyed = pilot ? [pilot.key] : bankItem!.resolvedKey.optionIds;
    const wrong = (state.item.options ?? []).map((o) => o.id).find((id) => !keyed.includes(id));
    const answer =
      outcome === 'dont-know' || (outcome === 'wrong' && wrong === undefined)
        ? { kind: 'dont-know' }
        : { kind: 'choice', optionIds: outcome === 'right' ? [...keyed] : [wrong!] };
    const stored = await callApi(
      baseUrl,
      'POST',
      '/api/attempt/responses',
      { itemId, answer, clientMs: 4000 + Math.round(random.uniform() * 20000) },
      token,
    );
    state = stored.attempt as AttemptView;
    answers++;
  }
  return answers;
}
