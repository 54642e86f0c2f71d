/**
 * Access control, counted: the role × route matrix of the server's tests
 * (tests/helpers/access-matrix.ts, the table tests/api/access-matrix.test.ts runs) called cell
 * by cell against the in-process app, plus cross-project probes: every matrix row that names a
 * record of the callers' own project is called again by each non-admin role with the matching
 * record of a project they are not a member of (project, spec, proposal), and must not succeed;
 * a read must answer exactly what an id that does not exist answers (no existence leak).
 * Wrongly allowed: a 2xx where the expected answer is a refusal (must be 0). Cells answering
 * another status than the table says are counted too.
 */
import { arrangeMatrix, CALLERS, fillUrl, MATRIX, type Caller, type Ids, type Row } from '../helpers/access-matrix';
import { buildApiApp, type AccountKey, type ApiClient, type TestApi } from '../helpers/api-app';
import { row, type PartResult, type RunOptions } from './lib';

const PART = 'Access control';
const MISSING_ID = 987654;
/** Own-project placeholders and the other project's record of the same kind. */
const CROSS: Record<string, keyof Ids> = { project: 'otherProject', device: 'otherDevice', spec: 'otherSpec', ranked: 'otherProposal', decided: 'otherProposal', approved: 'otherProposal', rankedForReview: 'otherProposal' };

async function call(api: TestApi, client: ApiClient, r: Row, url: string, ids: Ids, caller: Caller): Promise<{ status: number; body: unknown }> {
  await r.arrange?.(api, ids);
  const method = r.route.split(' ')[0].toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  const pending = client[method](url);
  const response = r.file ? await pending.attach('file', Buffer.from(r.file.content, 'utf8'), r.file.name) : r.body ? await pending.send(r.body(ids, caller)) : await pending;
  return { status: response.status, body: response.body };
}

export async function accessControl(options: RunOptions): Promise<PartResult> {
  const { log } = options;
  const api = await buildApiApp();
  try {
    const ids = await arrangeMatrix(api);
    const clients = {} as Record<Caller, ApiClient>;
    clients.anonymous = await api.anonymous();
    for (const role of ['admin', 'requirements', 'designer', 'reviewer'] as const) clients[role] = await api.agentFor(role);
    const clientFor = async (caller: Caller, fresh: boolean) => (!fresh ? clients[caller] : caller === 'anonymous' ? api.anonymous() : api.agentFor(caller as AccountKey));

    let probes = 0;
    let wronglyAllowed = 0;
    let otherMismatch = 0;
    const problems: string[] = [];
    for (const r of MATRIX) {
      for (const [i, caller] of CALLERS.entries()) {
        const expected = r.expected[i];
        const { status } = await call(api, await clientFor(caller, r.fresh === true), r, fillUrl(r.url, ids), ids, caller);
        probes += 1;
        if (expected >= 400 && status < 400) {
          wronglyAllowed += 1;
          problems.push(`wrongly allowed: ${caller} ${r.route} (${r.url}) → ${status}, expected ${expected}`);
        } else if (status !== expected) {
          otherMismatch += 1;
          problems.push(`${caller} ${r.route} (${r.url}) → ${status}, expected ${expected}`);
        }
      }
    }
    const matrixProbes = probes;

    // Cross-project: each own-project row again, with the other project's records, by each non-member role
    let crossProbes = 0;
    let leaks = 0;
    const ownRows = MATRIX.filter((r) => /\{(project|spec|ranked|decided|approved|rankedForReview)\}/.test(r.url) && !r.url.includes('{other'));
    for (const r of ownRows) {
      const crossUrl = r.url.replace(/\{(\w+)\}/g, (whole, key: string) => (CROSS[key] ? `{${CROSS[key]}}` : whole));
      const missingUrl = r.url.replace(/\{(\w+)\}/g, (whole, key: string) => (CROSS[key] ? String(MISSING_ID) : whole));
      for (const caller of ['requirements', 'designer', 'reviewer'] as const) {
        const client = await clientFor(caller, r.fresh === true);
        const other = await call(api, client, r, fillUrl(crossUrl, ids), ids, caller);
        crossProbes += 1;
        if (other.status < 400) {
          wronglyAllowed += 1;
          problems.push(`wrongly allowed across projects: ${caller} ${r.route} (${crossUrl}) → ${other.status}`);
          continue;
        }
        if (r.route.startsWith('GET ')) {
          const missing = await call(api, client, r, fillUrl(missingUrl, ids), ids, caller);
          if (missing.status !== other.status || JSON.stringify(missing.body) !== JSON.stringify(other.body)) {
            leaks += 1;
            problems.push(`existence leak: ${caller} ${r.route}: another project's record answers ${other.status} ${JSON.stringify(other.body).slice(0, 80)}, a missing one ${missing.status} ${JSON.stringify(missing.body).slice(0, 80)}`);
          }
        }
      }
    }
    log(`matrix: ${MATRIX.length} rows × ${CALLERS.length} callers = ${matrixProbes} probes; cross-project: ${ownRows.length} own-project rows × 3 non-member roles = ${crossProbes} probes`);
    for (const problem of problems.slice(0, 20)) log(`  ${problem}`);
    return {
      rows: [
        row(PART, 'probes made (matrix + cross-project)', `${matrixProbes} + ${crossProbes}`, '> 0', matrixProbes > 0 && crossProbes > 0),
        row(PART, 'wrongly allowed', wronglyAllowed, '0', wronglyAllowed === 0),
        row(PART, 'other answers than the table says', otherMismatch, '0', otherMismatch === 0),
        row(PART, 'other-project reads unlike a missing id', leaks, '0', leaks === 0),
      ],
    };
  } finally {
    await api.close();
  }
}
