import type { Sequelize } from 'sequelize';
import { AuditEntry } from '../models/audit-entry';
import { CalibrationRecord } from '../models/calibration-record';
import { DeviceProfileRecord } from '../models/device-profile';
import { SampleCorrection } from '../models/correction';
import { Instrument } from '../models/instrument';
import { MailMessage } from '../models/mail-message';
import { Signature, SignedReport, Signoff } from '../models/signoff';
import { Interpretation, RunRecord } from '../models/interpretation';
import { Organization } from '../models/organization';
import { Photo } from '../models/photo';
import { Project } from '../models/project';
import { Rig } from '../models/rig';
import { Run } from '../models/run';
import { RunEvent } from '../models/run-event';
import { defineSessionModel } from '../models/session';
import { TestLocation } from '../models/test-location';
import { TestPlan } from '../models/test-plan';
import { User } from '../models/user';

/** Initialises every model on one Sequelize instance, then wires the associations. */
export function initModels(sequelize: Sequelize) {
  for (const model of [Organization, User, Project, TestLocation, TestPlan, AuditEntry, Instrument, CalibrationRecord, Rig, Run, RunEvent, RunRecord, Interpretation, Signoff, Signature, SignedReport, MailMessage, SampleCorrection, Photo, DeviceProfileRecord]) model.initModel(sequelize);
  defineSessionModel(sequelize);
  Organization.hasMany(User, { foreignKey: 'organizationId' });
  User.belongsTo(Organization, { foreignKey: 'organizationId', as: 'organization' });
  Organization.hasMany(Project, { foreignKey: 'organizationId' });
  Project.belongsTo(Organization, { foreignKey: 'organizationId', as: 'organization' });
  Project.hasMany(TestLocation, { foreignKey: 'projectId', as: 'locations' });
  TestLocation.belongsTo(Project, { foreignKey: 'projectId', as: 'project' });
  TestLocation.hasMany(TestPlan, { foreignKey: 'locationId', as: 'plans' });
  TestPlan.belongsTo(TestLocation, { foreignKey: 'locationId', as: 'location' });
  Instrument.hasMany(CalibrationRecord, { foreignKey: 'instrumentId', as: 'calibrations' });
  CalibrationRecord.belongsTo(Instrument, { foreignKey: 'instrumentId', as: 'instrument' });
  Photo.belongsTo(User, { foreignKey: 'uploadedBy', as: 'uploader' });
}
