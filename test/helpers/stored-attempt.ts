import { type AttemptForm, attemptFormSchema } from '../../server/delivery/attempt-form.js';
import { hashAttemptToken } from '../../server/delivery/attempt-token.js';
import type { TestDatabase } from './test-databases.js';

/** The stored row of the attempt a respondent token belongs to: its id, parsed form and status. */
export async function storedAttempt(
  database: TestDatabase,
  token: string,
): Promise<{ id: string; form: AttemptForm; status: string }> {
  const row = await database.db
    .selectFrom('attempts')
    .selectAll()
    .where('token_hash', '=', hashAttemptToken(token))
    .executeTakeFirstOrThrow();
  const form = typeof row.form === 'string' ? JSON.parse(row.form) : row.form;
  return { id: row.id, form: attemptFormSchema.parse(form), status: row.status };
}
