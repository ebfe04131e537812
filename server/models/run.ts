import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import type { AlarmRecord } from '../../shared/hold/alarm-lifecycle';
import type { RunState } from '../../shared/runs/lifecycle';
import type { RunSetupSnapshot } from '../../shared/runs/measurement-model';
import type { RunPhase, StagePointLive } from '../../shared/schemas/runs';
import { jsonColumn } from './json';

/** What a run keeps between server restarts (the journal keeps the samples). */
export interface PersistedRun {
  lifecycle: RunState;
  /** Run clock: runMs = anchorRunMs + (wallMs − anchorWallMs) × speed (speed 1 for real rigs). */
  clock: { speed: number; anchorWallMs: number; anchorRunMs: number };
  alarms: Record<string, AlarmRecord>;
  lastSeq: number;
  /** Run time of the last sample, ms, for marking an outage after a restart. */
  lastSampleMs: number | null;
  /** End-of-hold points of the stages done so far (the load–settlement curve). */
  stagePoints?: StagePointLive[];
  /** What the run measures with, taken when it was created (absent on runs created before snapshots were kept). */
  setup?: RunSetupSnapshot;
}

export class Run extends Model<InferAttributes<Run>, InferCreationAttributes<Run>> {
  declare id: CreationOptional<number>;
  declare planId: number;
  declare rigId: number | null;
  declare status: RunPhase;
  declare state: PersistedRun;
  declare startedAt: Date | null;
  declare finishedAt: Date | null;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Run.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        planId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        rigId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        status: { type: DataTypes.STRING(24), allowNull: false },
        state: jsonColumn('state'),
        startedAt: { type: DataTypes.DATE(3), allowNull: true },
        finishedAt: { type: DataTypes.DATE(3), allowNull: true },
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'runs' },
    );
  }
}
