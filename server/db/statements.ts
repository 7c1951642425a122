// Prepared statements kept per connection. Preparing one (parsing and planning the SQL) costs more than
// running it for the small reads that every request makes (its session, its lot, the state of a lot's
// stored statistics); kept, each is prepared once per connection, the pool workers' connections included.
import type Database from 'better-sqlite3';

const perConnection = new WeakMap<Database.Database, Map<string, Database.Statement>>();

/** The connection's prepared statement for `sql`, prepared on first use. */
export function statement(sqlite: Database.Database, sql: string): Database.Statement {
  let byText = perConnection.get(sqlite);
  if (!byText) {
    byText = new Map();
    perConnection.set(sqlite, byText);
  }
  let s = byText.get(sql);
  if (!s) {
    s = sqlite.prepare(sql);
    byText.set(sql, s);
  }
  return s;
}

/**
 * A query built once per database handle and kept (drizzle's `.prepare()`): `build` makes it with
 * `sql.placeholder(…)` for the values that change from call to call.
 */
export function preparedPer<D extends object, Q>(build: (db: D) => Q): (db: D) => Q {
  const kept = new WeakMap<D, Q>();
  return (db) => {
    let q = kept.get(db);
    if (q === undefined) {
      q = build(db);
      kept.set(db, q);
    }
    return q;
  };
}
