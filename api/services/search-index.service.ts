/**
 * The one writer of the search index (`search_entry`; its full-text index follows it: FTS5 by
 * triggers on SQLite, a generated tsvector column on PostgreSQL). Every write path that changes
 * what the search shows calls `indexRecords` inside its own transaction: project created, spec
 * written or given a version, proposal ranked or moved to another state, account created or
 * renamed. `rebuildSearchIndex` indexes everything (the migration that made the index, the
 * benchmark's seeded rows).
 *
 * Records are read with plain SQL of the columns the index needs (so the migration can run this
 * before any later change to the entities) and written through api/search/search-documents.ts.
 */
import type { DataSource } from 'typeorm';
import type { SearchKind } from '#shared/api/search';
import type { ProposalState } from '#shared/workflow/proposal-states';
import { personDocument, projectDocument, proposalDocument, specDocument, type SearchDocument } from '../search/search-documents';
import { indexedWords } from '../search/search-words';
import { SqlParameters } from '../search/sql-parameters';

/** A transaction's manager or a migration's query runner: plain SQL and the data source it runs on. */
export interface SqlRunner {
  query(sql: string, parameters?: unknown[]): Promise<unknown>;
  readonly connection: DataSource;
}

/** Records read and written per statement. */
const BATCH = 500;

interface Indexed {
  refId: number;
  projectId: number | null;
  document: SearchDocument;
}

const rows = async <T>(runner: SqlRunner, sql: string, values: unknown[]) => (await runner.query(sql, values)) as T[];

/** The JSON of a stored spec document (text on every back end), or null when it cannot be read. */
function parsed(payload: unknown): unknown {
  if (typeof payload !== 'string') return payload;
  try {
    return JSON.parse(payload);
  } catch {
    return null;
  }
}

/** How each kind's records are read by id and made into documents. */
const READERS: Record<SearchKind, (runner: SqlRunner, ids: readonly number[]) => Promise<Indexed[]>> = {
  async project(runner, ids) {
    const p = new SqlParameters(runner.connection);
    const found = await rows<{ id: number; name: string; description: string | null }>(runner, `SELECT id, name, description FROM project WHERE id IN (${p.list(ids)})`, p.values);
    return found.map((r) => ({ refId: Number(r.id), projectId: Number(r.id), document: projectDocument({ name: r.name, description: r.description ?? '' }) }));
  },
  async person(runner, ids) {
    const p = new SqlParameters(runner.connection);
    const found = await rows<{ id: number; display_name: string; email: string }>(runner, `SELECT id, display_name, email FROM user_account WHERE id IN (${p.list(ids)})`, p.values);
    return found.map((r) => ({ refId: Number(r.id), projectId: null, document: personDocument({ displayName: r.display_name, email: r.email }) }));
  },
  async spec(runner, ids) {
    const p = new SqlParameters(runner.connection);
    const found = await rows<{ id: number; project_id: number; title: string; version: number; note: string | null; payload: unknown }>(
      runner,
      `SELECT s.id, s.project_id, v.title, v.version, v.note, v.payload FROM spec s JOIN spec_version v ON v.spec_id = s.id AND v.version = s.latest_version WHERE s.id IN (${p.list(ids)})`,
      p.values,
    );
    return found.map((r) => ({
      refId: Number(r.id),
      projectId: Number(r.project_id),
      document: specDocument({ title: r.title, version: Number(r.version), note: r.note, payload: parsed(r.payload) }),
    }));
  },
  async proposal(runner, ids) {
    const p = new SqlParameters(runner.connection);
    const found = await rows<{ id: number; project_id: number; status: ProposalState; recommended_topology: string | null; title: string; version: number; decided: string | null }>(
      runner,
      `SELECT p.id, p.project_id, p.status, p.recommended_topology, v.title, v.version,
              (SELECT d.topology FROM decision d WHERE d.proposal_id = p.id ORDER BY d.id DESC LIMIT 1) AS decided
       FROM proposal p JOIN spec_version v ON v.id = p.spec_version_id WHERE p.id IN (${p.list(ids)})`,
      p.values,
    );
    return found.map((r) => ({
      refId: Number(r.id),
      projectId: Number(r.project_id),
      document: proposalDocument({ id: Number(r.id), specTitle: r.title, specVersion: Number(r.version), status: r.status, recommendedTopology: r.recommended_topology, decidedTopology: r.decided }),
    }));
  },
};

/** Replaces the entries of these records of one kind (a record gone from its table loses its entry). */
async function writeEntries(runner: SqlRunner, kind: SearchKind, ids: readonly number[], entries: readonly Indexed[]): Promise<void> {
  const drop = new SqlParameters(runner.connection);
  await runner.query(`DELETE FROM search_entry WHERE kind = ${drop.add(kind)} AND ref_id IN (${drop.list(ids)})`, drop.values);
  if (entries.length === 0) return;
  const p = new SqlParameters(runner.connection);
  const tuples = entries.map(({ refId, projectId, document }) => {
    const body = document.lines.join('\n');
    return `(${p.list([kind, refId, projectId, document.title, body, indexedWords(document.title), indexedWords(body)])})`;
  });
  await runner.query(`INSERT INTO search_entry (kind, ref_id, project_id, title, body, title_words, body_words) VALUES ${tuples.join(', ')}`, p.values);
}

/** Indexes these records of one kind as they are now (inside the caller's transaction, after its writes). */
export async function indexRecords(runner: SqlRunner, kind: SearchKind, ids: readonly number[]): Promise<void> {
  for (let start = 0; start < ids.length; start += BATCH) {
    const batch = ids.slice(start, start + BATCH);
    await writeEntries(runner, kind, batch, await READERS[kind](runner, batch));
  }
}

/** The tables each kind is read from. */
const TABLES: Record<SearchKind, string> = { project: 'project', spec: 'spec', proposal: 'proposal', person: 'user_account' };

/** Indexes every record of every kind afresh. */
export async function rebuildSearchIndex(runner: SqlRunner): Promise<void> {
  await runner.query('DELETE FROM search_entry');
  for (const kind of Object.keys(TABLES) as SearchKind[]) {
    let after = 0;
    for (;;) {
      const p = new SqlParameters(runner.connection);
      const next = await rows<{ id: number }>(runner, `SELECT id FROM ${TABLES[kind]} WHERE id > ${p.add(after)} ORDER BY id LIMIT ${BATCH}`, p.values);
      if (next.length === 0) break;
      const ids = next.map((r) => Number(r.id));
      await writeEntries(runner, kind, ids, await READERS[kind](runner, ids));
      after = ids.at(-1)!;
    }
  }
}
