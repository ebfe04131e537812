import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import type { RevisionNote, Signature as SignatureDto, SignatureMeaning, SignoffState } from '../../shared/schemas/signoff';
import { jsonColumn } from './json';

/** The review state of one run. Revision 1 is the first; reopening a signed run starts the next. */
export class Signoff extends Model<InferAttributes<Signoff>, InferCreationAttributes<Signoff>> {
  declare runId: number;
  declare state: SignoffState;
  declare revision: number;
  declare interpretationVersion: number | null;
  declare submittedBy: number | null;
  declare submittedAt: Date | null;
  declare revisions: RevisionNote[];
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Signoff.init(
      {
        runId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        state: { type: DataTypes.STRING(24), allowNull: false },
        revision: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        interpretationVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        submittedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        submittedAt: { type: DataTypes.DATE(3), allowNull: true },
        revisions: jsonColumn('revisions'),
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'signoffs' },
    );
  }
}

/** One signature: who, when, what it means, and the hash of the data signed. Never changed or deleted. */
export class Signature extends Model<InferAttributes<Signature>, InferCreationAttributes<Signature>> {
  declare id: CreationOptional<number>;
  declare runId: number;
  declare revision: number;
  declare interpretationVersion: number;
  declare userId: number | null;
  declare signerName: string;
  declare meaning: SignatureMeaning;
  declare dataHash: string;
  declare signedAt: Date;

  toDto(): SignatureDto {
    return {
      id: this.id,
      revision: this.revision,
      interpretationVersion: this.interpretationVersion,
      userId: this.userId,
      signerName: this.signerName,
      meaning: this.meaning,
      dataHash: this.dataHash,
      signedAt: this.signedAt.toISOString(),
    };
  }

  static initModel(sequelize: Sequelize) {
    Signature.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        revision: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        interpretationVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        signerName: { type: DataTypes.STRING(160), allowNull: false },
        meaning: { type: DataTypes.STRING(24), allowNull: false },
        dataHash: { type: DataTypes.CHAR(64), allowNull: false },
        signedAt: { type: DataTypes.DATE(3), allowNull: false },
      },
      { sequelize, tableName: 'signatures', timestamps: false },
    );
  }
}

/**
 * The sealed report of one signature: the canonical JSON of everything the report showed at signing
 * (its SHA-256 is the signature's `dataHash`) and the PDF rendered then, with its SHA-256. Written once.
 */
export class SignedReport extends Model<InferAttributes<SignedReport>, InferCreationAttributes<SignedReport>> {
  declare signatureId: number;
  declare runId: number;
  /** Canonical JSON text, exactly the bytes hashed. */
  declare snapshot: string;
  declare snapshotHash: string;
  declare pdf: Buffer;
  declare pdfHash: string;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    SignedReport.init(
      {
        signatureId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        snapshot: { type: DataTypes.TEXT('long'), allowNull: false },
        snapshotHash: { type: DataTypes.CHAR(64), allowNull: false },
        pdf: { type: DataTypes.BLOB('long'), allowNull: false },
        pdfHash: { type: DataTypes.CHAR(64), allowNull: false },
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'signed_reports', updatedAt: false },
    );
  }
}
