import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import { canonicalJson } from '../../src/domain/count/chain';
import type { Count } from './count.model';

/**
 * One event of a count's log, hash-chained to the one before (src/domain/count/chain.ts). Append-only: written
 * only by server/counts/log.ts, and database triggers refuse UPDATE and DELETE.
 */
export class CountEvent extends Model<InferAttributes<CountEvent>, InferCreationAttributes<CountEvent>> {
  declare id: CreationOptional<number>;
  declare countId: ForeignKey<Count['id']>;
  declare seq: number;
  declare type: string;
  /** Stored as canonical JSON text, parsed on read. */
  declare payload: unknown;
  declare actorUserId: number | null;
  declare actorName: string | null;
  declare station: string | null;
  /** Epoch milliseconds, server time. */
  declare at: number;
  declare commandId: string | null;
  declare prevHash: string;
  declare hash: string;

  static initModel(sequelize: Sequelize) {
    CountEvent.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        seq: { type: DataTypes.INTEGER, allowNull: false },
        type: { type: DataTypes.STRING(60), allowNull: false },
        payload: {
          type: DataTypes.TEXT,
          allowNull: false,
          get(this: CountEvent): unknown {
            return JSON.parse(this.getDataValue('payload') as string) as unknown;
          },
          set(this: CountEvent, value: unknown) {
            this.setDataValue('payload', canonicalJson(value));
          },
        },
        actorUserId: { type: DataTypes.INTEGER, allowNull: true },
        actorName: { type: DataTypes.STRING(120), allowNull: true },
        station: { type: DataTypes.STRING(40), allowNull: true },
        at: { type: DataTypes.INTEGER, allowNull: false },
        commandId: { type: DataTypes.STRING(100), allowNull: true },
        prevHash: { type: DataTypes.STRING(64), allowNull: false },
        hash: { type: DataTypes.STRING(64), allowNull: false },
      },
      { sequelize, tableName: 'count_events', timestamps: false },
    );
  }
}
