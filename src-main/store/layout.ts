// The layout check: a file's sqlite_master must list exactly the tables and indices our DDL
// creates for its schema version, with the same SQL. Anything else (a trigger, a view, an
// extra table or index, a changed column or constraint) is refused, since SQLite would run
// triggers on writes and views or CHECK expressions on reads.
import Database from 'better-sqlite3';
import { SCHEMAS } from './schema.ts';

interface MasterRow {
  type: string;
  name: string;
  tbl_name: string;
  sql: string | null;
}

/** Whitespace-insensitive form of a CREATE statement: runs of blanks become one, none around ( ) , */
const normalise = (sql: string | null): string =>
  (sql ?? '').replace(/\s+/g, ' ').replace(/ ?([(),]) ?/g, '$1').trim();
const key = (r: MasterRow): string => `${r.type}\u0000${r.name}\u0000${r.tbl_name}\u0000${normalise(r.sql)}`;

const expectedCache = new Map<number, Map<string, MasterRow>>();

/** What sqlite_master holds after running a version's DDL (read from a scratch in-memory database). */
function expectedLayout(version: number): Map<string, MasterRow> {
  const hit = expectedCache.get(version);
  if (hit) return hit;
  const ddl = SCHEMAS[version];
  if (!ddl) throw new Error(`no layout known for schema ${version}`);
  const db = new Database(':memory:');
  try {
    for (const stmt of ddl) db.exec(stmt);
    const rows = db.prepare('SELECT type, name, tbl_name, sql FROM sqlite_master').all() as MasterRow[];
    const map = new Map(rows.map((r) => [key(r), r]));
    expectedCache.set(version, map);
    return map;
  } finally {
    db.close();
  }
}

/** Throws an Error naming the first unexpected or missing object. */
export function checkLayout(db: Database.Database, version: number): void {
  const expected = expectedLayout(version);
  const rows = db.prepare('SELECT type, name, tbl_name, sql FROM sqlite_master').all() as MasterRow[];
  const seen = new Set<string>();
  for (const r of rows) {
    const k = key(r);
    if (!expected.has(k)) {
      const byName = [...expected.values()].find((e) => e.name === r.name && e.type === r.type);
      if (byName) throw new Error(`unexpected layout: ${r.type} '${r.name}' differs from schema ${version}`);
      throw new Error(`unexpected ${r.type} '${r.name}' (schema ${version} has no such object; refusing a file that carries extra ${r.type}s)`);
    }
    seen.add(k);
  }
  for (const [k, e] of expected) {
    if (!seen.has(k)) throw new Error(`missing ${e.type} '${e.name}' of schema ${version}`);
  }
}
