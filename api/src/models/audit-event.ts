import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One line of an organisation's audit log: who did what to what, from where, and when. */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: string;
  declare organisationId: string;
  declare action: string;
  declare actorKind: 'user' | 'key' | 'system';
  declare actorId: string | null;
  declare actorLabel: string | null;
  declare targetKind: string | null;
  declare targetId: string | null;
  declare targetLabel: string | null;
  declare address: string | null;
  declare details: Record<string, unknown> | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    return AuditEvent.init(
      {
        id: { type: DataTypes.STRING(36), primaryKey: true },
        organisationId: { type: DataTypes.STRING(36), allowNull: false },
        action: { type: DataTypes.STRING(60), allowNull: false },
        actorKind: { type: DataTypes.STRING(10), allowNull: false },
        actorId: { type: DataTypes.STRING(36), allowNull: true },
        actorLabel: { type: DataTypes.STRING(320), allowNull: true },
        targetKind: { type: DataTypes.STRING(20), allowNull: true },
        targetId: { type: DataTypes.STRING(36), allowNull: true },
        targetLabel: { type: DataTypes.STRING(320), allowNull: true },
        address: { type: DataTypes.STRING(64), allowNull: true },
        details: { type: DataTypes.JSON, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'audit_events', updatedAt: false },
    );
  }
}
