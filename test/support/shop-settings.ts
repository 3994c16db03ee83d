// Checks for a shop setting that every session carries to the pages (`shop` in GET /api/session):
// the owner saves it and anyone signed in afterwards reads it; a value outside its list is refused
// at its field and changes nothing.
import type { Role } from '../../shared/session-types';
import { signedIn } from './api';

type Setting = 'labelStock' | 'locale';

/** The owner sets `key` to `value`; a fresh `reader` finds it in the session; then it is put back. */
export async function expectCarriedToSessions(
  key: Setting,
  value: string,
  reader: Role,
): Promise<void> {
  const owner = await signedIn('owner');
  const before = (await owner.get('/api/settings')).body[key] as string;
  try {
    const saved = await owner.patch('/api/settings', { [key]: value });
    expect(saved.status).toBe(200);
    expect(saved.body[key]).toBe(value);
    const other = await signedIn(reader);
    const session = await other.get('/api/session');
    expect(session.body.shop).toMatchObject({ [key]: value });
  } finally {
    await owner.patch('/api/settings', { [key]: before });
  }
}

/** The owner sends `key: value`: 400 with exactly one detail, `message` at the field; no change. */
export async function expectRefusedAtField(key: Setting, value: string, message: string) {
  const owner = await signedIn('owner');
  const before = (await owner.get('/api/settings')).body[key] as string;
  const res = await owner.patch('/api/settings', { [key]: value });
  expect(res.status).toBe(400);
  expect(res.body.error.details).toEqual([{ field: key, message }]);
  expect((await owner.get('/api/settings')).body[key]).toBe(before);
}
