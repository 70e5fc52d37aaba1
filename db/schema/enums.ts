import { pgEnum } from "drizzle-orm/pg-core";

export const roleEnum = pgEnum("role", ["admin", "metrologist", "site_manager", "technician", "analyst"]);
export const instrumentKindEnum = pgEnum("instrument_kind", [
  "micro_balance",
  "semi_micro_balance",
  "analytical_balance",
  "precision_balance",
  "bench_scale",
  "floor_scale",
]);
export const accuracyClassEnum = pgEnum("accuracy_class", ["I", "II", "III", "IIII"]);
export const instrumentStatusEnum = pgEnum("instrument_status", ["in_service", "out_of_service", "retired"]);
export const riskLevelEnum = pgEnum("risk_level", ["low", "medium", "high"]);
export const massUnitEnum = pgEnum("mass_unit", ["mg", "g", "kg"]);
export const checkTypeEnum = pgEnum("check_type", ["sensitivity", "repeatability", "eccentricity"]);
export const outcomeEnum = pgEnum("outcome", ["in_tolerance", "guard_band", "out_of_tolerance"]);
export const checkSourceEnum = pgEnum("check_source", ["form", "api", "import"]);
export const eccentricityPositionEnum = pgEnum("eccentricity_position", [
  "centre",
  "front-left",
  "back-left",
  "back-right",
  "front-right",
]);
export const eventKindEnum = pgEnum("event_kind", ["calibration", "adjustment", "repair", "relocation", "note"]);
export const toleranceBasisEnum = pgEnum("tolerance_basis", ["absolute", "percent_of_load", "usp41", "oiml_r76_in_service"]);
export const guardBandPolicyEnum = pgEnum("guard_band_policy", ["fraction_of_tolerance", "expanded_uncertainty", "none"]);
export const importStatusEnum = pgEnum("import_status", ["uploading", "validating", "rejected", "importing", "done", "failed"]);

export const ROLES = roleEnum.enumValues;
export type Role = (typeof ROLES)[number];
export const INSTRUMENT_KINDS = instrumentKindEnum.enumValues;
export type InstrumentKind = (typeof INSTRUMENT_KINDS)[number];
export const ACCURACY_CLASSES = accuracyClassEnum.enumValues;
export type AccuracyClass = (typeof ACCURACY_CLASSES)[number];
export const INSTRUMENT_STATUSES = instrumentStatusEnum.enumValues;
export type InstrumentStatus = (typeof INSTRUMENT_STATUSES)[number];
export const MASS_UNITS = massUnitEnum.enumValues;
export type MassUnit = (typeof MASS_UNITS)[number];
export const CHECK_TYPES = checkTypeEnum.enumValues;
export type CheckType = (typeof CHECK_TYPES)[number];
