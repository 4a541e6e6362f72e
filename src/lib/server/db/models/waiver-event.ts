import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize
} from 'sequelize';

/** Things that happen to a waiver, in the past tense as the history shows them. */
export const WAIVER_ACTIONS = ['proposed', 'approved', 'rejected', 'revoked', 'expired', 'commented'] as const;
export type WaiverAction = (typeof WAIVER_ACTIONS)[number];

/** One line of a waiver's history: who did what, when, with an optional note. Append-only. */
export class WaiverEvent extends Model<InferAttributes<WaiverEvent>, InferCreationAttributes<WaiverEvent>> {
  declare id: CreationOptional<number>;
  declare waiverId: number;
  /** Null for events the server raises itself (expiry) or when the user was deleted. */
  declare userId: number | null;
  declare action: WaiverAction;
  declare note: string | null;
  declare createdAt: CreationOptional<Date>;

  /** Binds the model to a Sequelize instance (columns mirror migration 0001). */
  static initModel(sequelize: Sequelize): typeof WaiverEvent {
    WaiverEvent.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        waiverId: { type: DataTypes.INTEGER, allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        action: { type: DataTypes.STRING(10), allowNull: false, validate: { isIn: [WAIVER_ACTIONS] } },
        note: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE
      },
      { sequelize, tableName: 'waiver_events', updatedAt: false }
    );
    return WaiverEvent;
  }
}
