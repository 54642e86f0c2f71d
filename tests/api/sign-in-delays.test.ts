/**
 * Failed sign-ins slow the address that makes them instead of locking the account: a flood of
 * wrong passwords from one address never keeps the owner out from another, the flooding
 * address waits longer and longer (1 s, 2 s, 4 s, … after five free failures), an address
 * that keeps failing also waits for the account's own delay, and the per-address limit over all
 * accounts still holds. The app trusts X-Forwarded-For here (as behind the documented proxy), so
 * each request names its address; the addresses are from the documentation ranges (RFC 5737).
 * The delays run on a clock the test moves.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, test } from 'vitest';
import { FREE_PAIR_FAILURES } from '../../api/auth/sign-in-throttle';
import { buildApiApp, csrfClient, emailOf, TEST_PASSWORD, type AccountKey, type TestApi } from '../helpers/api-app';

/** A flooding address per test (the per-address limit of 30 over all accounts is not what these tests measure). */
let flooder = 0;
let FLOODER = '';
const OWNER_DESK = '198.51.100.20';

let api: TestApi;
let nowMs = Date.parse('2026-03-02T09:00:00Z');

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'designer', 'reviewer', 'requirements'], trustProxy: true, clock: () => nowMs });
});

afterAll(async () => {
  await api?.close();
});

beforeEach(() => {
  // Each test starts past every earlier record's window.
  nowMs += 60 * 60 * 1000;
  flooder += 1;
  FLOODER = `203.0.113.${100 + flooder}`;
});

async function signInFrom(address: string, email: string, password: string) {
  const client = await csrfClient(api.app);
  return client.post('/api/auth/login').set('X-Forwarded-For', address).send({ email, password });
}
const wrong = (i: number) => `not-the-password-${i}`;

describe('when one address floods one account with wrong passwords', () => {
  test('when 10 wrong passwords came from address A, then the right password from address B signs in', async () => {
    // Arrange
    for (let i = 0; i < 10; i += 1) {
      const response = await signInFrom(FLOODER, emailOf('admin'), wrong(i));
      expect([401, 429]).toContain(response.status);
    }

    // Act
    const owner = await signInFrom(OWNER_DESK, emailOf('admin'), TEST_PASSWORD);

    // Assert
    expect(owner.status, JSON.stringify(owner.body)).toBe(200);
    expect(owner.body.user.email).toBe(emailOf('admin'));
  });

  test('when the flooding address has used its five free failures, then its next try waits 1 s, and the wait doubles with each further failure', async () => {
    // Arrange
    for (let i = 0; i < FREE_PAIR_FAILURES; i += 1) expect((await signInFrom(FLOODER, emailOf('designer'), wrong(i))).status).toBe(401);

    // Act: try at once, then after each wait
    const retryAfter: string[] = [];
    for (let i = 0; i < 4; i += 1) {
      const refused = await signInFrom(FLOODER, emailOf('designer'), wrong(100 + i));
      expect(refused.status).toBe(429);
      expect(refused.body.code).toBe('too-many-attempts');
      retryAfter.push(refused.headers['retry-after']);
      nowMs += Number(refused.headers['retry-after']) * 1000;
      expect((await signInFrom(FLOODER, emailOf('designer'), wrong(200 + i))).status).toBe(401);
    }

    // Assert: 1 s, 2 s, 4 s, 8 s
    expect(retryAfter).toEqual(['1', '2', '4', '8']);
  });

  test('when the flooding address is waiting, then even the right password from it is refused unchecked, and accepted once the wait is over', async () => {
    // Arrange
    for (let i = 0; i <= FREE_PAIR_FAILURES; i += 1) await signInFrom(FLOODER, emailOf('reviewer'), wrong(i));

    // Act
    const during = await signInFrom(FLOODER, emailOf('reviewer'), TEST_PASSWORD);
    nowMs += Number(during.headers['retry-after']) * 1000;
    const after = await signInFrom(FLOODER, emailOf('reviewer'), TEST_PASSWORD);

    // Assert
    expect(during.status).toBe(429);
    expect(during.body.error).toMatch(/wait \d+ s/);
    expect(after.status).toBe(200);
  });

  test('when an account that does not exist is flooded, then its answers are the same as for an account that does', async () => {
    const statuses = async (email: string, address: string) => {
      const seen: number[] = [];
      for (let i = 0; i < FREE_PAIR_FAILURES + 2; i += 1) seen.push((await signInFrom(address, email, wrong(i))).status);
      return seen;
    };

    const unknown = await statuses('nobody-here@tests.longtail.test', '203.0.113.50');
    const known = await statuses(emailOf('requirements'), '203.0.113.51');

    expect(unknown).toEqual(known);
    expect(known).toEqual([401, 401, 401, 401, 401, 429, 429]);
  });
});

describe('when several addresses fail on one account', () => {
  test('when 12 failures came from four addresses, then an address with three failures of its own waits for the account, and a new address still signs in', async () => {
    // Arrange: three failures from each of four addresses (12 on the account; each address is below its own five)
    const key: AccountKey = 'admin';
    const addresses = ['203.0.113.11', '203.0.113.12', '203.0.113.13', '203.0.113.14'];
    for (const address of addresses) for (let i = 0; i < 3; i += 1) expect((await signInFrom(address, emailOf(key), wrong(i))).status).toBe(401);

    // Act
    const repeat = await signInFrom(addresses[0], emailOf(key), TEST_PASSWORD);
    const newcomer = await signInFrom(OWNER_DESK, emailOf(key), TEST_PASSWORD);

    // Assert
    expect(repeat.status).toBe(429);
    expect(repeat.body.error).toMatch(/for this account: wait/);
    expect(newcomer.status).toBe(200);
  });
});
