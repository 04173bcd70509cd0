import type { Sequelize } from 'sequelize';
import { AnomalyAttachment } from './anomaly-attachment.model';
import { AnomalyHazard } from './anomaly-hazard.model';
import { AnomalyHistory } from './anomaly-history.model';
import { AnomalyRevision } from './anomaly-revision.model';
import { Anomaly } from './anomaly.model';
import { CorrectiveAction } from './corrective-action.model';
import { CountEvent } from './count-event.model';
import { Count } from './count.model';
import { CrewAssignment } from './crew-assignment.model';
import { CrewPlan } from './crew-plan.model';
import { HazardAcceptance } from './hazard-acceptance.model';
import { HazardHistory } from './hazard-history.model';
import { Hazard } from './hazard.model';
import { Invitation } from './invitation.model';
import { MailMessage } from './mail-message.model';
import { NotificationDigestItem } from './notification-digest-item.model';
import { MitigationEvidence } from './mitigation-evidence.model';
import { Mitigation } from './mitigation.model';
import { PasswordReset } from './password-reset.model';
import { ProcedureAttachment } from './procedure-attachment.model';
import { ProcedureRevision } from './procedure-revision.model';
import { ProcedureSignoff } from './procedure-signoff.model';
import { Procedure } from './procedure.model';
import { PropellantCautionHistory } from './propellant-caution-history.model';
import { PropellantCautionOverride } from './propellant-caution-override.model';
import { RiskMatrix } from './risk-matrix.model';
import { SensorDataset } from './sensor-dataset.model';
import { Session } from './session.model';
import { Station } from './station.model';
import { Team } from './team.model';
import { Upload } from './upload.model';
import { User } from './user.model';

const MODELS = {
  Team,
  User,
  Invitation,
  PasswordReset,
  MailMessage,
  Session,
  RiskMatrix,
  Hazard,
  Mitigation,
  MitigationEvidence,
  HazardAcceptance,
  HazardHistory,
  PropellantCautionOverride,
  PropellantCautionHistory,
  Upload,
  Station,
  Procedure,
  ProcedureRevision,
  ProcedureSignoff,
  ProcedureAttachment,
  CrewPlan,
  CrewAssignment,
  Count,
  CountEvent,
  NotificationDigestItem,
  Anomaly,
  AnomalyHazard,
  AnomalyAttachment,
  CorrectiveAction,
  AnomalyHistory,
  AnomalyRevision,
  SensorDataset,
};

/** Every model and association, in one place. */
export function initModels(sequelize: Sequelize) {
  for (const model of Object.values(MODELS)) model.initModel(sequelize);

  Team.hasMany(User, { foreignKey: 'teamId' });
  User.belongsTo(Team, { foreignKey: 'teamId' });
  Team.hasMany(Invitation, { foreignKey: 'teamId' });
  Invitation.belongsTo(User, { as: 'invitedBy', foreignKey: 'invitedById' });
  User.hasMany(PasswordReset, { foreignKey: 'userId' });
  PasswordReset.belongsTo(User, { foreignKey: 'userId' });

  Team.hasMany(RiskMatrix, { foreignKey: 'teamId' });
  RiskMatrix.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
  Team.hasMany(Hazard, { foreignKey: 'teamId' });
  Hazard.belongsTo(Team, { foreignKey: 'teamId' });
  Hazard.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
  Hazard.hasMany(Mitigation, { as: 'mitigations', foreignKey: 'hazardId', onDelete: 'CASCADE' });
  Mitigation.belongsTo(Hazard, { foreignKey: 'hazardId' });
  Mitigation.hasMany(MitigationEvidence, { as: 'evidence', foreignKey: 'mitigationId', onDelete: 'CASCADE' });
  MitigationEvidence.belongsTo(Mitigation, { foreignKey: 'mitigationId' });
  MitigationEvidence.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
  Hazard.hasMany(HazardAcceptance, { as: 'acceptances', foreignKey: 'hazardId', onDelete: 'CASCADE' });
  HazardAcceptance.belongsTo(User, { foreignKey: 'userId' });
  Hazard.hasMany(HazardHistory, { as: 'history', foreignKey: 'hazardId', onDelete: 'CASCADE' });
  HazardHistory.belongsTo(User, { foreignKey: 'userId' });
  Team.hasMany(PropellantCautionOverride, { foreignKey: 'teamId' });
  PropellantCautionOverride.belongsTo(User, { as: 'updatedBy', foreignKey: 'updatedById' });
  Team.hasMany(PropellantCautionHistory, { foreignKey: 'teamId' });
  PropellantCautionHistory.belongsTo(User, { foreignKey: 'userId' });
  Team.hasMany(Upload, { foreignKey: 'teamId' });
  Upload.belongsTo(User, { as: 'uploadedBy', foreignKey: 'uploadedById' });
  MitigationEvidence.belongsTo(Upload, { as: 'upload', foreignKey: 'uploadId' });

  Team.hasMany(Station, { foreignKey: 'teamId' });
  Team.hasMany(Procedure, { foreignKey: 'teamId' });
  Procedure.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
  Procedure.hasMany(ProcedureRevision, { as: 'revisions', foreignKey: 'procedureId', onDelete: 'CASCADE' });
  ProcedureRevision.belongsTo(Procedure, { foreignKey: 'procedureId' });
  ProcedureRevision.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
  ProcedureRevision.belongsTo(User, { as: 'updatedBy', foreignKey: 'updatedById' });
  ProcedureRevision.hasMany(ProcedureSignoff, { as: 'signoffs', foreignKey: 'revisionId', onDelete: 'CASCADE' });
  ProcedureSignoff.belongsTo(User, { foreignKey: 'userId' });
  ProcedureRevision.hasMany(ProcedureAttachment, { as: 'attachments', foreignKey: 'revisionId', onDelete: 'CASCADE' });
  ProcedureAttachment.belongsTo(ProcedureRevision, { foreignKey: 'revisionId' });
  ProcedureAttachment.belongsTo(Upload, { as: 'upload', foreignKey: 'uploadId' });
  ProcedureAttachment.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
  Team.hasMany(CrewPlan, { foreignKey: 'teamId' });
  CrewPlan.belongsTo(Procedure, { as: 'procedure', foreignKey: 'procedureId' });
  CrewPlan.hasMany(CrewAssignment, { as: 'assignments', foreignKey: 'crewPlanId', onDelete: 'CASCADE' });
  CrewAssignment.belongsTo(Station, { as: 'station', foreignKey: 'stationId' });
  CrewAssignment.belongsTo(User, { as: 'user', foreignKey: 'userId' });

  Team.hasMany(Count, { foreignKey: 'teamId' });
  Count.belongsTo(Procedure, { as: 'procedure', foreignKey: 'procedureId' });
  Count.belongsTo(ProcedureRevision, { as: 'revision', foreignKey: 'revisionId' });
  Count.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
  Count.hasMany(CountEvent, { as: 'events', foreignKey: 'countId' });
  CountEvent.belongsTo(Count, { foreignKey: 'countId' });
  User.hasMany(NotificationDigestItem, { foreignKey: 'userId', onDelete: 'CASCADE' });

  Team.hasMany(Anomaly, { foreignKey: 'teamId' });
  Anomaly.belongsTo(Count, { as: 'count', foreignKey: 'countId' });
  Anomaly.belongsTo(User, { as: 'reportedBy', foreignKey: 'reportedById' });
  Anomaly.belongsTo(User, { as: 'closedBy', foreignKey: 'closedById' });
  Anomaly.belongsToMany(Hazard, { through: AnomalyHazard, as: 'hazards', foreignKey: 'anomalyId', otherKey: 'hazardId' });
  Hazard.belongsToMany(Anomaly, { through: AnomalyHazard, as: 'anomalies', foreignKey: 'hazardId', otherKey: 'anomalyId' });
  AnomalyHazard.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
  Anomaly.hasMany(AnomalyAttachment, { as: 'attachments', foreignKey: 'anomalyId', onDelete: 'CASCADE' });
  AnomalyAttachment.belongsTo(Upload, { as: 'upload', foreignKey: 'uploadId' });
  AnomalyAttachment.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
  Anomaly.hasMany(CorrectiveAction, { as: 'actions', foreignKey: 'anomalyId', onDelete: 'CASCADE' });
  CorrectiveAction.belongsTo(User, { as: 'owner', foreignKey: 'ownerId' });
  Anomaly.hasMany(AnomalyHistory, { as: 'history', foreignKey: 'anomalyId', onDelete: 'CASCADE' });
  AnomalyHistory.belongsTo(User, { foreignKey: 'userId' });
  Anomaly.hasMany(AnomalyRevision, { as: 'revisionLinks', foreignKey: 'anomalyId', onDelete: 'CASCADE' });
  AnomalyRevision.belongsTo(Anomaly, { as: 'anomaly', foreignKey: 'anomalyId' });
  AnomalyRevision.belongsTo(ProcedureRevision, { as: 'revision', foreignKey: 'revisionId' });
  AnomalyRevision.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });

  Team.hasMany(SensorDataset, { foreignKey: 'teamId' });
  Count.hasMany(SensorDataset, { as: 'sensorDatasets', foreignKey: 'countId' });
  SensorDataset.belongsTo(Count, { foreignKey: 'countId' });
  SensorDataset.belongsTo(Upload, { as: 'upload', foreignKey: 'uploadId' });
  SensorDataset.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });

  return MODELS;
}

export {
  Anomaly,
  AnomalyAttachment,
  AnomalyHazard,
  AnomalyHistory,
  AnomalyRevision,
  CorrectiveAction,
  Count,
  CountEvent,
  CrewAssignment,
  CrewPlan,
  Hazard,
  HazardAcceptance,
  HazardHistory,
  Invitation,
  MailMessage,
  Mitigation,
  NotificationDigestItem,
  MitigationEvidence,
  PasswordReset,
  Procedure,
  ProcedureAttachment,
  ProcedureRevision,
  ProcedureSignoff,
  PropellantCautionHistory,
  PropellantCautionOverride,
  RiskMatrix,
  SensorDataset,
  Session,
  Station,
  Team,
  Upload,
  User,
};
