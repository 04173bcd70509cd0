import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { SensorTimeBase } from '../../src/contract/sensors';
import type { Count } from './count.model';
import { jsonColumn } from './json-column';
import type { Team } from './team.model';
import type { Upload } from './upload.model';
import type { User } from './user.model';

export interface StoredChannel {
  name: string;
  unit: string;
  low: number | null;
  high: number | null;
}

/** One uploaded file of test data for a count: its channels and limits, and its readings as packed columns. */
export class SensorDataset extends Model<InferAttributes<SensorDataset>, InferCreationAttributes<SensorDataset>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare countId: ForeignKey<Count['id']>;
  declare uploadId: ForeignKey<Upload['id']>;
  declare timeBase: SensorTimeBase;
  declare timeColumn: string;
  declare rowCount: number;
  declare tStart: number;
  declare tEnd: number;
  declare channels: StoredChannel[];
  /** Packed columns (server/sensors/columns.ts); left out of list queries. */
  declare data: Buffer;
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare upload?: NonAttribute<Upload>;
  declare createdBy?: NonAttribute<Pick<User, 'id' | 'name'> | null>;

  static initModel(sequelize: Sequelize) {
    SensorDataset.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        timeBase: { type: DataTypes.STRING(12), allowNull: false },
        timeColumn: { type: DataTypes.STRING(80), allowNull: false },
        rowCount: { type: DataTypes.INTEGER, allowNull: false },
        tStart: { type: DataTypes.DOUBLE, allowNull: false },
        tEnd: { type: DataTypes.DOUBLE, allowNull: false },
        channels: jsonColumn<StoredChannel[]>('channels', []),
        data: { type: DataTypes.BLOB, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'sensor_datasets' },
    );
  }
}
