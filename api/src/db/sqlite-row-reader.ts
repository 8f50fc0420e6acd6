/**
 * Reads one row of a model by id and organisation on SQLite without going through Sequelize's query
 * path, for the hottest lookups (the trace of every sample batch and every chart request).
 *
 * Why: a Sequelize `findOne` on SQLite first asks `PRAGMA table_info` of the table, then runs the
 * SELECT, each through a freshly prepared statement (six trips to the sqlite3 worker thread), and
 * captures a stack trace per query; on a busy server that is several milliseconds per lookup. Here it
 * is one prepared statement on a connection of its own (which in WAL mode sees committed data only,
 * as Sequelize's does outside a transaction), and the row becomes an instance exactly as Sequelize
 * builds one from a SELECT: the same conversions its SQLite dialect applies (JSON text parsed, dates
 * read as UTC, the float specials), then `Model.build(row, { isNewRecord: false, raw: true })`.
 */
import { DataTypes, type Model, type ModelStatic } from 'sequelize';
import type { Db } from './open.js';
import { PreparedStatements } from './prepared-statements.js';
import type { Database as SqliteDatabase } from 'sqlite3';

type Conversion = (value: unknown) => unknown;

const FLOAT_SPECIALS: Record<string, number> = { NaN: Number.NaN, Infinity: Number.POSITIVE_INFINITY, '-Infinity': Number.NEGATIVE_INFINITY };

/** How Sequelize's SQLite dialect turns a stored value of this type into the attribute's value. */
function conversionOf(type: unknown): Conversion | null {
  if (type instanceof DataTypes.JSON) return (v) => (typeof v === 'string' ? JSON.parse(v) : v);
  // Sequelize writes '2026-03-02 08:00:00.000 +00:00'; a value without a zone is UTC (its fixed timezone).
  if (type instanceof DataTypes.DATE) return (v) => (typeof v === 'string' ? new Date(v.includes('+') ? v : `${v}+00:00`) : v);
  if (type instanceof DataTypes.DOUBLE || type instanceof DataTypes.FLOAT || type instanceof DataTypes.REAL) {
    return (v) => (typeof v === 'string' && v in FLOAT_SPECIALS ? FLOAT_SPECIALS[v] : v);
  }
  return null;
}

export class SqliteRowReader {
  private readonly prepared = new PreparedStatements();
  private readonly conversions = new Map<ModelStatic<Model>, Array<[string, Conversion]>>();

  constructor(private readonly db: Pick<Db, 'sequelize' | 'onClose'>) {
    db.onClose(() => this.prepared.finalizeAll());
  }

  private connection(): Promise<SqliteDatabase> {
    const manager = this.db.sequelize.connectionManager as unknown as { getConnection(o: { uuid: string }): Promise<SqliteDatabase> };
    return manager.getConnection({ uuid: 'headroom-row-reader' });
  }

  private conversionsOf(model: ModelStatic<Model>): Array<[string, Conversion]> {
    let list = this.conversions.get(model);
    if (!list) {
      list = [];
      for (const [name, attribute] of Object.entries(model.getAttributes())) {
        // Kept simple: the models read here name their columns as their attributes and hold no booleans.
        if ((attribute.field ?? name) !== name || attribute.type instanceof DataTypes.BOOLEAN) {
          throw new Error(`SqliteRowReader does not read ${model.name}.${name}`);
        }
        const convert = conversionOf(attribute.type);
        if (convert) list.push([attribute.field ?? name, convert]);
      }
      this.conversions.set(model, list);
    }
    return list;
  }

  /** The row with this id in this organisation, as an instance of the model, or null. */
  async findInOrganisation<M extends Model>(model: ModelStatic<M>, id: string, organisationId: string): Promise<M | null> {
    const table = model.getTableName() as string;
    const rows = await this.prepared.all<Record<string, unknown>>(
      await this.connection(),
      `SELECT * FROM "${table}" WHERE "id" = ? AND "organisationId" = ? LIMIT 1`,
      [id, organisationId],
    );
    const row = rows[0];
    if (!row) return null;
    for (const [field, convert] of this.conversionsOf(model as unknown as ModelStatic<Model>)) {
      if (row[field] !== null && row[field] !== undefined) row[field] = convert(row[field]);
    }
    return model.build(row as M['_creationAttributes'], { isNewRecord: false, raw: true });
  }
}
