import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';
import { USER_ROLES, type UserRole } from '../../../types/roles';

/**
 * An invitation to create an account with a given role. Only the SHA-256 of the link's
 * secret is stored; the link stops working at `expiresAt` or once `acceptedAt` is set.
 */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare role: UserRole;
  declare tokenHash: string;
  declare invitedById: number | null;
  declare expiresAt: Date;
  declare acceptedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof Invitation {
    Invitation.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        email: {
          type: DataTypes.STRING(320),
          allowNull: false,
          validate: { isEmail: true },
          set(value: string) {
            this.setDataValue('email', String(value).trim().toLowerCase());
          }
        },
        role: { type: DataTypes.STRING(16), allowNull: false, validate: { isIn: [USER_ROLES] } },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true, validate: { is: /^[0-9a-f]{64}$/ } },
        invitedById: { type: DataTypes.INTEGER, allowNull: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE
      },
      { sequelize, tableName: 'invitations', updatedAt: false }
    );
    return Invitation;
  }
}
