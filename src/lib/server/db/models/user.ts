import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';
import { USER_ROLES, type UserRole } from '../../../types/roles';

/** How much mail a user wants: every build verdict, only base-branch news, or nothing. */
export const MAIL_PREFERENCES = ['all', 'base', 'none'] as const;
export type MailPreference = (typeof MAIL_PREFERENCES)[number];

/**
 * A person who signs in. E-mail addresses are stored trimmed and lower-cased, so uniqueness
 * ignores case. Accounts are disabled (`disabledAt`), never deleted, so history keeps its authors.
 */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare name: string;
  /** bcrypt hash (bcryptjs); the password itself is never stored. */
  declare passwordHash: string;
  /** Site-wide role; for non-admins it is the default role of new memberships. */
  declare role: CreationOptional<UserRole>;
  declare mailPreference: CreationOptional<MailPreference>;
  declare disabledAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof User {
    User.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        email: {
          type: DataTypes.STRING(320),
          allowNull: false,
          unique: true,
          validate: { isEmail: true },
          set(value: string) {
            this.setDataValue('email', String(value).trim().toLowerCase());
          }
        },
        name: { type: DataTypes.STRING(200), allowNull: false, validate: { len: [1, 200] } },
        passwordHash: { type: DataTypes.STRING(100), allowNull: false },
        role: {
          type: DataTypes.STRING(16),
          allowNull: false,
          defaultValue: 'viewer',
          validate: { isIn: [USER_ROLES] }
        },
        mailPreference: {
          type: DataTypes.STRING(8),
          allowNull: false,
          defaultValue: 'all',
          validate: { isIn: [MAIL_PREFERENCES] }
        },
        disabledAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE
      },
      { sequelize, tableName: 'users' }
    );
    return User;
  }
}
