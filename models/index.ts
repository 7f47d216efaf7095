import { sequelize } from "@/lib/db";
import { AnalysisRun } from "./AnalysisRun";
import { ApiToken } from "./ApiToken";
import { AuditEvent } from "./AuditEvent";
import { Group } from "./Group";
import { ImportProfile } from "./ImportProfile";
import { Invitation } from "./Invitation";
import { LegalHold } from "./LegalHold";
import { Membership } from "./Membership";
import { Peak } from "./Peak";
import { Project } from "./Project";
import { RetentionFlag } from "./RetentionFlag";
import { RetentionPolicy } from "./RetentionPolicy";
import { Review } from "./Review";
import { Sample } from "./Sample";
import { SampleParent } from "./SampleParent";
import { Series } from "./Series";
import { Share } from "./Share";
import { Signature } from "./Signature";
import { Spectrum } from "./Spectrum";
import { Tombstone } from "./Tombstone";
import { User } from "./User";

export {
  AnalysisRun,
  ApiToken,
  AuditEvent,
  Group,
  LegalHold,
  Membership,
  Peak,
  Project,
  RetentionPolicy,
  Review,
  Sample,
  SampleParent,
  Series,
  Share,
  Signature,
  Spectrum,
  User,
};
export { ImportProfile, Invitation, RetentionFlag, Tombstone };

/**
 * Binds every model to the process's Sequelize instance (lib/db.ts). It runs once, when this module
 * is first imported, so code that imports a model can use it at once; each copy of this module that
 * a bundler loads binds its own classes.
 */
function bindModels() {
  const db = sequelize();
  if (User.sequelize === db) return;
  for (const m of [
    User,
    Group,
    Membership,
    Project,
    Sample,
    SampleParent,
    Series,
    Spectrum,
    AnalysisRun,
    Peak,
    Signature,
    Review,
    RetentionPolicy,
    LegalHold,
    Share,
    AuditEvent,
    ApiToken,
    Tombstone,
    RetentionFlag,
    Invitation,
    ImportProfile,
  ]) {
    m.initialize(db);
  }
  Membership.belongsTo(User, { foreignKey: "userId" });
  Membership.belongsTo(Group, { foreignKey: "groupId" });
  User.hasMany(Membership, { foreignKey: "userId" });
  Group.hasMany(Membership, { foreignKey: "groupId" });
  Project.belongsTo(Group, { foreignKey: "groupId" });
  Sample.belongsTo(Project, { foreignKey: "projectId" });
  Sample.belongsToMany(Sample, { as: "parents", through: SampleParent, foreignKey: "sampleId", otherKey: "parentId" });
  Series.belongsTo(Project, { foreignKey: "projectId" });
  Spectrum.belongsTo(Project, { foreignKey: "projectId" });
  Spectrum.belongsTo(Sample, { foreignKey: "sampleId" });
  Spectrum.belongsTo(Series, { foreignKey: "seriesId" });
  Spectrum.belongsTo(Spectrum, { as: "reference", foreignKey: "referenceSpectrumId" });
  Spectrum.belongsTo(User, { as: "uploader", foreignKey: "uploadedBy" });
  Spectrum.hasMany(AnalysisRun, { foreignKey: "spectrumId" });
  AnalysisRun.belongsTo(Spectrum, { foreignKey: "spectrumId" });
  AnalysisRun.hasMany(Peak, { foreignKey: "runId" });
  AnalysisRun.hasMany(Signature, { foreignKey: "runId" });
  Signature.belongsTo(AnalysisRun, { foreignKey: "runId" });
  Signature.belongsTo(Spectrum, { foreignKey: "spectrumId" });
  Signature.hasMany(Review, { foreignKey: "signatureId" });
  Review.belongsTo(User, { as: "reviewer", foreignKey: "reviewerId" });
}

bindModels();
