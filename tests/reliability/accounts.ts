/**
 * Sign-in under a lockout flood: one address sends wrong passwords for the administrator's
 * account as fast as the server answers, while the owner signs in from another address once a
 * second. The owner must get in every time; the flooding address gets few passwords checked (its
 * delays grow, then the per-address limit stops it). The in-process app trusts X-Forwarded-For,
 * as behind the documented proxy, so each request names its address (documentation ranges,
 * RFC 5737). Then the delays alone on a simulated clock: how many passwords one address gets
 * checked against one account in an hour when it tries at every moment it may, and whether an
 * address new to an account still gets in while twenty others fail on it.
 */
import { FREE_PAIR_FAILURES, SignInThrottle } from '../../api/auth/sign-in-throttle';
import { buildApiApp, csrfClient, emailOf, TEST_PASSWORD } from '../helpers/api-app';
import { row, sleep, type PartResult, type RunOptions } from './lib';

const PART = 'Accounts';
const FLOODER = '203.0.113.7';
const OWNER = '198.51.100.20';

/** One address trying one account at every moment the delays allow, for `hours`: passwords checked. */
function simulatedGuesses(hours: number): number {
  let now = 0;
  const throttle = new SignInThrottle(() => now);
  let checked = 0;
  const end = hours * 3600_000;
  while (now < end) {
    const verdict = throttle.check('owner@example.test', 'flooder');
    if (verdict.allowed) {
      checked += 1;
      throttle.recordFailure('owner@example.test', 'flooder');
      now += 50; // the next try 50 ms later (a fast client)
    } else now += verdict.retryAfterMs;
  }
  return checked;
}

/** Twenty addresses each fail on one account as often as they may for 15 minutes; then may a new address try? */
function newAddressDuringSpread(): boolean {
  let now = 0;
  const throttle = new SignInThrottle(() => now);
  for (; now < 15 * 60_000; now += 1000) {
    for (let a = 0; a < 20; a += 1) if (throttle.check('owner@example.test', `spread-${a}`).allowed) throttle.recordFailure('owner@example.test', `spread-${a}`);
  }
  return throttle.check('owner@example.test', 'owner-desk').allowed;
}

export async function accountsPart(options: RunOptions): Promise<PartResult> {
  const { log } = options;
  const floodMs = options.quick ? 10_000 : 20_000;
  const api = await buildApiApp({ accounts: ['admin'], trustProxy: true });
  try {
    const email = emailOf('admin');
    const flood = { sent: 0, checked: 0, refused: 0, other: 0 };
    const owner = { tries: 0, signedIn: 0, answers: new Map<number, number>() };
    const stopAt = performance.now() + floodMs;
    const attacker = (async () => {
      const client = await csrfClient(api.app);
      for (let i = 0; performance.now() < stopAt; i += 1) {
        const response = await client.post('/api/auth/login').set('X-Forwarded-For', FLOODER).send({ email, password: `flood-guess-${i}` });
        flood.sent += 1;
        if (response.status === 401) flood.checked += 1;
        else if (response.status === 429) flood.refused += 1;
        else flood.other += 1;
      }
    })();
    const ownerRuns = (async () => {
      while (performance.now() < stopAt) {
        await sleep(1000);
        const client = await csrfClient(api.app);
        const response = await client.post('/api/auth/login').set('X-Forwarded-For', OWNER).send({ email, password: TEST_PASSWORD });
        owner.tries += 1;
        owner.answers.set(response.status, (owner.answers.get(response.status) ?? 0) + 1);
        if (response.status === 200) owner.signedIn += 1;
      }
    })();
    await Promise.all([attacker, ownerRuns]);
    const answers = [...owner.answers].map(([s, n]) => `${s}×${n}`).join(' ');
    log(`flood ${floodMs / 1000} s from ${FLOODER}: ${flood.sent} tries, ${flood.checked} passwords checked, ${flood.refused} refused (429), ${flood.other} other; owner from ${OWNER}: ${owner.signedIn}/${owner.tries} signed in (${answers})`);
    const perHour = simulatedGuesses(1);
    const newcomer = newAddressDuringSpread();
    log(`delays alone (simulated clock): ${perHour} passwords checked per hour for one address on one account; new address during a 20-address spread: ${newcomer ? 'may try' : 'refused'}`);
    return {
      rows: [
        row(PART, 'owner sign-ins from another address during a wrong-password flood', `${owner.signedIn}/${owner.tries}`, 'all', owner.tries > 0 && owner.signedIn === owner.tries),
        row(PART, `passwords checked for the flooding address in ${floodMs / 1000} s`, `${flood.checked} of ${flood.sent} tries`, `≤ ${FREE_PAIR_FAILURES + 5}`, flood.checked <= FREE_PAIR_FAILURES + 5),
        row(PART, 'passwords checked per hour, one address on one account (delays alone)', perHour, '≤ 30', perHour <= 30),
        row(PART, 'an address new to the account may try during a 20-address spread', newcomer ? 'yes' : 'no', 'yes', newcomer),
      ],
    };
  } finally {
    await api.close();
  }
}
