import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type OneTimeTokenPurpose = 'invitation' | 'password-reset';

/** A single-use, expiring token sent by e-mail (invitation or password reset); stored as a SHA-256 hash. */
export class OneTimeToken extends Model<InferAttributes<OneTimeToken>, InferCreationAttributes<OneTimeToken>> {
  declare id: string;
  declare organisationId: string;
  declare userId: string;
  declare purpose: OneTimeTokenPurpose;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    return OneTimeToken.init(
      {
        id: { type: DataTypes.STRING(36), primaryKey: true },
        organisationId: { type: DataTypes.STRING(36), allowNull: false },
        userId: { type: DataTypes.STRING(36), allowNull: false },
        purpose: { type: DataTypes.STRING(20), allowNull: false },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        usedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'one_time_tokens', updatedAt: false },
    );
  }
}
