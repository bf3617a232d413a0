import { User } from "./User.js";
import { Production } from "./Production.js";
import { Membership } from "./Membership.js";
import { Invitation } from "./Invitation.js";
import { PasswordReset } from "./PasswordReset.js";
import { AuditEvent } from "./AuditEvent.js";
import { OutboxMessage } from "./OutboxMessage.js";
import { Performer } from "./Performer.js";
import { Character } from "./Character.js";
import { CharacterDouble } from "./CharacterDouble.js";
import { Scene } from "./Scene.js";
import { ShootDay } from "./ShootDay.js";
import { ShootDayScene } from "./ShootDayScene.js";
import { Change } from "./Change.js";
import { ChangeItem } from "./ChangeItem.js";
import { Appearance } from "./Appearance.js";
import { Photo } from "./Photo.js";
import { ContinuityEntry } from "./ContinuityEntry.js";
import { ContinuityEntryGarment } from "./ContinuityEntryGarment.js";
import { Fabric } from "./Fabric.js";
import { FabricTest } from "./FabricTest.js";
import { MultiplesGroup } from "./MultiplesGroup.js";
import { Garment } from "./Garment.js";
import { GarmentStatusEvent } from "./GarmentStatusEvent.js";
import { GarmentCheckout } from "./GarmentCheckout.js";
import { MeasurementSet } from "./MeasurementSet.js";
// Workroom feature.
import { Fitting } from "./Fitting.js";
import { AlterationTicket } from "./AlterationTicket.js";
import { WorkroomCapacity } from "./WorkroomCapacity.js";
import { WorkroomEmailJob } from "./WorkroomEmailJob.js";
import { SnagDismissal } from "./SnagDismissal.js";
// Digital doubles
import { Panel } from "./Panel.js";
import { Seam } from "./Seam.js";
import { Marker } from "./Marker.js";
import { Packet } from "./Packet.js";
import { PacketRecipient } from "./PacketRecipient.js";
import { ReportRun } from "./ReportRun.js";

// Associations, grouped by owner.
Membership.belongsTo(User, { as: "user", foreignKey: "userId" });
Membership.belongsTo(Production, { as: "production", foreignKey: "productionId" });
User.hasMany(Membership, { as: "memberships", foreignKey: "userId" });
Production.hasMany(Membership, { as: "memberships", foreignKey: "productionId" });
Invitation.belongsTo(Production, { as: "production", foreignKey: "productionId" });
PasswordReset.belongsTo(User, { as: "user", foreignKey: "userId" });
// Workroom feature (tables it owns; garments, performers and changes are read with SQL until their models merge).
AlterationTicket.belongsTo(Fitting, { as: "fitting", foreignKey: "fittingId" });
Fitting.hasMany(AlterationTicket, { as: "tickets", foreignKey: "fittingId" });
AlterationTicket.belongsTo(User, { as: "assignee", foreignKey: "assigneeId" });
WorkroomCapacity.belongsTo(User, { as: "user", foreignKey: "userId" });

// Breakdown: cast, scenes, shoot days, changes, appearances, continuity.
Character.belongsTo(Performer, { as: "performer", foreignKey: "performerId" });
Character.hasMany(CharacterDouble, { as: "doubles", foreignKey: "characterId" });
CharacterDouble.belongsTo(Performer, { as: "performer", foreignKey: "performerId" });
ShootDay.hasMany(ShootDayScene, { as: "dayScenes", foreignKey: "shootDayId" });
ShootDayScene.belongsTo(Scene, { as: "scene", foreignKey: "sceneId" });
Change.hasMany(ChangeItem, { as: "items", foreignKey: "changeId" });
ContinuityEntry.hasMany(ContinuityEntryGarment, { as: "garments", foreignKey: "continuityEntryId" });

// Wardrobe: fabrics and tests, garments, multiples groups, status history, measurement sets.
Fabric.hasMany(FabricTest, { as: "tests", foreignKey: "fabricId" });
FabricTest.belongsTo(Fabric, { as: "fabric", foreignKey: "fabricId" });
FabricTest.belongsTo(User, { as: "tester", foreignKey: "testedBy" });
Garment.belongsTo(Fabric, { as: "fabric", foreignKey: "fabricId" });
Garment.belongsTo(MultiplesGroup, { as: "multiplesGroup", foreignKey: "multiplesGroupId" });
MultiplesGroup.hasMany(Garment, { as: "garments", foreignKey: "multiplesGroupId" });
Garment.hasMany(GarmentStatusEvent, { as: "events", foreignKey: "garmentId" });
GarmentStatusEvent.belongsTo(User, { as: "actor", foreignKey: "actorId" });
// Check-outs: the open one rides along with the garment in lists and detail (includes filter returnedAt: null).
Garment.hasOne(GarmentCheckout, { as: "openCheckout", foreignKey: "garmentId" });
GarmentCheckout.belongsTo(Garment, { as: "garment", foreignKey: "garmentId" });
GarmentCheckout.belongsTo(ShootDay, { as: "shootDay", foreignKey: "shootDayId" });
GarmentCheckout.belongsTo(Scene, { as: "scene", foreignKey: "sceneId" });
GarmentCheckout.belongsTo(User, { as: "checkedOutByUser", foreignKey: "checkedOutBy" });
MeasurementSet.belongsTo(User, { as: "taker", foreignKey: "takenBy" });

export { Fabric, FabricTest, MultiplesGroup, Garment, GarmentStatusEvent, GarmentCheckout, MeasurementSet };
export { User, Production, Membership, Invitation, PasswordReset, AuditEvent, OutboxMessage };
export {
  Performer,
  Character,
  CharacterDouble,
  Scene,
  ShootDay,
  ShootDayScene,
  Change,
  ChangeItem,
  Appearance,
  Photo,
  ContinuityEntry,
  ContinuityEntryGarment,
};
export { Fitting, AlterationTicket, WorkroomCapacity, WorkroomEmailJob };

// Snags
SnagDismissal.belongsTo(User, { as: "dismisser", foreignKey: "dismissedBy" });
export { SnagDismissal };

// Digital doubles
Seam.belongsTo(Panel, { as: "panelA", foreignKey: "panelAId" });
Seam.belongsTo(Panel, { as: "panelB", foreignKey: "panelBId" });
Packet.hasMany(PacketRecipient, { as: "recipients", foreignKey: "packetId" });
PacketRecipient.belongsTo(Packet, { as: "packet", foreignKey: "packetId" });
PacketRecipient.belongsTo(User, { as: "user", foreignKey: "userId" });

export { Panel, Seam, Marker, Packet, PacketRecipient };

// Reports
export { ReportRun };
