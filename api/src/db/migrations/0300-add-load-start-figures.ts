import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate.js';

/**
 * A load's start-up figures when known from its nameplate or maker (e.g. a hermetic compressor's
 * locked-rotor amps), used by the headroom check when the load has no trace.
 */
export async function up({ queryInterface: qi }: MigrationContext): Promise<void> {
  await qi.addColumn('loads', 'startPeakA', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('loads', 'startDurationS', { type: DataTypes.DOUBLE, allowNull: true });
}

export async function down({ queryInterface: qi }: MigrationContext): Promise<void> {
  await qi.removeColumn('loads', 'startDurationS');
  await qi.removeColumn('loads', 'startPeakA');
}
