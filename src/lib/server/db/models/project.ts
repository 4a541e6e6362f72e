import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';

/** Project slugs: lower-case letters, digits and dashes, 2 to 63 characters, not starting with a dash. */
export const PROJECT_SLUG_PATTERN = /^[a-z0-9][a-z0-9-]{1,62}$/;

/**
 * A body of assets linted together, usually one repository. Its slug appears in URLs and in
 * the CLI's `--project`; builds on `baseBranch` form the baseline and the trend.
 */
export class Project extends Model<InferAttributes<Project>, InferCreationAttributes<Project>> {
  declare id: CreationOptional<number>;
  declare slug: string;
  declare name: string;
  declare baseBranch: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof Project {
    Project.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        slug: { type: DataTypes.STRING(63), allowNull: false, unique: true, validate: { is: PROJECT_SLUG_PATTERN } },
        name: { type: DataTypes.STRING(200), allowNull: false, validate: { len: [1, 200] } },
        baseBranch: {
          type: DataTypes.STRING(255),
          allowNull: false,
          defaultValue: 'main',
          validate: { len: [1, 255] }
        },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE
      },
      { sequelize, tableName: 'projects' }
    );
    return Project;
  }
}
