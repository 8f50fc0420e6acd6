/**
 * Chunk store through the Sequelize models only: works on every dialect Sequelize supports, and is
 * the store used on PostgreSQL. Same visibility rule and transactions as the SQLite store
 * (see chunk-store.ts); each call is one `sequelize.transaction()` with `{ transaction }` on every query.
 */
import { Op, type Transaction } from 'sequelize';
import type { Db } from '../db/open.js';
import type { BatchCommit, ChunkData, ChunkEnvelope, ChunkStore, StoredChunk } from './chunk-store.js';
import { SUMMARY_COLUMNS, type ChunkSummaryRow } from './summary-rows.js';

const finite = (t: number) => Math.max(-Number.MAX_VALUE, Math.min(Number.MAX_VALUE, t));

export class SequelizeChunkStore implements ChunkStore {
  constructor(private readonly db: Db) {}

  private async insertChunks(traceId: string, organisationId: string, chunks: StoredChunk[], transaction: Transaction): Promise<void> {
    if (chunks.length === 0) return;
    const { TraceChunk, TraceChunkData } = this.db.models;
    await TraceChunk.bulkCreate(chunks.map((c) => ({ ...c.row, traceId, organisationId })), { transaction });
    await TraceChunkData.bulkCreate(
      chunks.map((c) => ({ traceId, seq: c.row.seq, envelope: c.envelope, times: c.times, samples: c.samples })),
      { transaction },
    );
  }

  async insertPending(traceId: string, organisationId: string, chunks: StoredChunk[]): Promise<void> {
    if (chunks.length === 0) return;
    await this.db.sequelize.transaction((transaction) => this.insertChunks(traceId, organisationId, chunks, transaction));
  }

  commit(batch: BatchCommit): Promise<boolean> {
    const { Trace, TraceChunk, TraceChunkData, IdempotencyKey } = this.db.models;
    return this.db.sequelize.transaction(async (transaction) => {
      const s = batch.state;
      const [changed] = await Trace.update(
        {
          sampleCount: s.sampleCount,
          chunkCount: s.chunkCount,
          originUs: s.originUs,
          firstSampleUs: s.firstSampleUs,
          lastSampleUs: s.lastSampleUs,
          gapThresholdS: s.gapThresholdS,
          summary: s.summary as unknown as Record<string, unknown> | null,
        },
        {
          where: { id: batch.traceId, organisationId: batch.organisationId, status: 'open', chunkCount: batch.expectedChunkCount },
          transaction,
        },
      );
      if (changed !== 1) return false;
      if (batch.replaceLast) {
        const c = batch.replaceLast;
        const where = { traceId: batch.traceId, seq: c.row.seq };
        const columns = Object.fromEntries(SUMMARY_COLUMNS.map((n) => [n, c.row[n]]));
        await TraceChunk.update(columns, { where, transaction });
        await TraceChunkData.update({ envelope: c.envelope, times: c.times, samples: c.samples }, { where, transaction });
      }
      await this.insertChunks(batch.traceId, batch.organisationId, batch.chunks, transaction);
      if (batch.idempotency) await IdempotencyKey.create({ ...batch.idempotency, createdAt: new Date() }, { transaction });
      return true;
    });
  }

  async discardPending(traceId: string, fromSeq: number): Promise<void> {
    const { TraceChunk, TraceChunkData } = this.db.models;
    await this.db.sequelize.transaction(async (transaction) => {
      const where = { traceId, seq: { [Op.gte]: fromSeq } };
      await TraceChunkData.destroy({ where, transaction });
      await TraceChunk.destroy({ where, transaction });
    });
  }

  async readSummaries(traceId: string, chunkCount: number, fromUs: number, toUs: number): Promise<ChunkSummaryRow[]> {
    const rows = await this.db.models.TraceChunk.findAll({
      attributes: ['seq', ...SUMMARY_COLUMNS],
      // ±Infinity does not survive every dialect's escaping; the largest finite double bounds every time.
      where: { traceId, seq: { [Op.lt]: chunkCount }, lastUs: { [Op.gte]: finite(fromUs) }, firstUs: { [Op.lte]: finite(toUs) } },
      order: [['seq', 'ASC']],
      raw: true,
    });
    return rows as unknown as ChunkSummaryRow[];
  }

  async readData(traceId: string, fromSeq: number, toSeq: number): Promise<ChunkData[]> {
    const rows = await this.db.models.TraceChunkData.findAll({
      attributes: ['seq', 'samples', 'times'],
      where: { traceId, seq: { [Op.between]: [fromSeq, toSeq] } },
      order: [['seq', 'ASC']],
      raw: true,
    });
    return rows as unknown as ChunkData[];
  }

  async readDataOf(traceId: string, seqs: number[]): Promise<ChunkData[]> {
    if (seqs.length === 0) return [];
    const rows = await this.db.models.TraceChunkData.findAll({
      attributes: ['seq', 'samples', 'times'],
      where: { traceId, seq: { [Op.in]: seqs } },
      order: [['seq', 'ASC']],
      raw: true,
    });
    return rows as unknown as ChunkData[];
  }

  async readEnvelopes(traceId: string, fromSeq: number, toSeq: number, withTimes: boolean): Promise<ChunkEnvelope[]> {
    const rows = await this.db.models.TraceChunkData.findAll({
      attributes: withTimes ? ['seq', 'envelope', 'times'] : ['seq', 'envelope'],
      where: { traceId, seq: { [Op.between]: [fromSeq, toSeq] } },
      order: [['seq', 'ASC']],
      raw: true,
    });
    return (rows as unknown as ChunkEnvelope[]).map((r) => ({ seq: r.seq, envelope: r.envelope, times: r.times ?? null }));
  }
}
