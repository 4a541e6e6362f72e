import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';

/**
 * One saved revision of a project's lint policy. Revisions are append-only and numbered from 1
 * per project; the project's current policy is its highest revision, and older ones stay for history.
 */
export class ProjectPolicy extends Model<InferAttributes<ProjectPolicy>, InferCreationAttributes<ProjectPolicy>> {
  declare id: CreationOptional<number>;
  declare projectId: number;
  declare revision: number;
  /** The policy document as JSON text (validated by `parsePolicy` before saving). */
  declare policyJson: string;
  /** `policyVersionOf(policy)`: content hash shared with builds and assets. */
  declare policyVersion: string;
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof ProjectPolicy {
    ProjectPolicy.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        projectId: { type: DataTypes.INTEGER, allowNull: false },
        revision: { type: DataTypes.INTEGER, allowNull: false, validate: { min: 1 } },
        policyJson: { type: DataTypes.TEXT, allowNull: false },
        policyVersion: { type: DataTypes.STRING(32), allowNull: false },
        createdById: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE
      },
      { sequelize, tableName: 'project_policies', updatedAt: false }
    );
    return ProjectPolicy;
  }
}
