import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';

/** What a token may do; `submit` posts builds for its project. */
export const API_TOKEN_SCOPES = ['submit'] as const;
export type ApiTokenScope = (typeof API_TOKEN_SCOPES)[number];

/**
 * A CI credential for one project. Only the SHA-256 of the secret is stored (`tokenHash`),
 * plus a short `prefix` so people can tell tokens apart; the secret is shown once at creation.
 */
export class ApiToken extends Model<InferAttributes<ApiToken>, InferCreationAttributes<ApiToken>> {
  declare id: CreationOptional<number>;
  declare projectId: number;
  declare name: string;
  /** Lower-case hex SHA-256 of the secret. */
  declare tokenHash: string;
  /** First characters of the secret, for display only. */
  declare prefix: string;
  /** Comma-separated scopes. */
  declare scopes: CreationOptional<string>;
  declare createdById: number | null;
  declare lastUsedAt: CreationOptional<Date | null>;
  declare revokedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof ApiToken {
    ApiToken.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        projectId: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.STRING(100), allowNull: false, validate: { len: [1, 100] } },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true, validate: { is: /^[0-9a-f]{64}$/ } },
        prefix: { type: DataTypes.STRING(16), allowNull: false },
        scopes: {
          type: DataTypes.STRING(100),
          allowNull: false,
          defaultValue: 'submit',
          validate: {
            isKnownScopes(value: string) {
              const unknown = value
                .split(',')
                .filter((scope) => !(API_TOKEN_SCOPES as readonly string[]).includes(scope));
              if (unknown.length > 0)
                throw new Error(`unknown scope "${unknown[0]}" (use ${API_TOKEN_SCOPES.join(', ')})`);
            }
          }
        },
        createdById: { type: DataTypes.INTEGER, allowNull: true },
        lastUsedAt: { type: DataTypes.DATE, allowNull: true },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE
      },
      { sequelize, tableName: 'api_tokens' }
    );
    return ApiToken;
  }
}
