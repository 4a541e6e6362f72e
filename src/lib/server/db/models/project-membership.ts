import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';
import { PROJECT_ROLES, type ProjectRole } from '../../../types/roles';

/**
 * A user's role in one project. Membership decides whether a non-admin sees the project at
 * all; one row per (project, user). Deleting the project or the user deletes the membership.
 */
export class ProjectMembership extends Model<
  InferAttributes<ProjectMembership>,
  InferCreationAttributes<ProjectMembership>
> {
  declare id: CreationOptional<number>;
  declare projectId: number;
  declare userId: number;
  declare role: ProjectRole;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof ProjectMembership {
    ProjectMembership.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        projectId: { type: DataTypes.INTEGER, allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: false },
        role: { type: DataTypes.STRING(16), allowNull: false, validate: { isIn: [PROJECT_ROLES] } },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE
      },
      { sequelize, tableName: 'project_memberships' }
    );
    return ProjectMembership;
  }
}
