// Equipment, protective gear and field figures: the vocabulary of the contract section
// "Equipment, gear and field figures" (/work/shared/CREW-CHECK.md). Pure types and constants,
// client-safe. Every field here is optional on the snapshot: absent means "not tracked".

export const GEAR_KINDS = ["rubber_gloves", "rubber_sleeves"] as const;
export type GearKind = (typeof GEAR_KINDS)[number];

/** Rubber insulating equipment classes of 29 CFR 1910.137 Table I-4, lowest first. */
export const GEAR_CLASSES = ["00", "0", "1", "2", "3", "4"] as const;
export type GearClass = (typeof GEAR_CLASSES)[number];

/** One pair of rubber gloves or sleeves on a worker's record. */
export interface GearItem {
  kind: GearKind;
  class: GearClass;
  /** The date (YYYY-MM-DD) of its last electrical test; null = never tested (not in service). */
  testedOn: string | null;
}

export const EQUIPMENT_KINDS = ["bucket_truck", "digger_derrick", "pickup", "trailer", "other"] as const;
export type EquipmentKind = (typeof EQUIPMENT_KINDS)[number];

export const LICENCES = ["cdl_a", "cdl_b"] as const;
export type Licence = (typeof LICENCES)[number];

export interface Equipment {
  id: string;
  name: string;
  kind: EquipmentKind;
  /** An insulated aerial device (default false). */
  insulated: boolean;
  /** Date (YYYY-MM-DD) of the aerial device's last dielectric test; null = none on record. */
  dielectricTestedOn: string | null;
  /** The licence class its driver needs; null = no commercial licence. */
  licence: Licence | null;
}

export interface EquipmentAssignment {
  workOrderId: string;
  equipmentId: string;
}

/** A planned lift with rope blocks, a hand line and slings. Forces in pounds. */
export interface Lift {
  /** The load W (a transformer's nameplate weight). */
  loadLb: number;
  /** N, the parts of line supporting the load (>= 1). */
  partsOfLine: number;
  /** n, the sheaves the line runs over (default: partsOfLine). */
  sheaves: number;
  /** f, the friction allowance per sheave (default 0.10). */
  frictionPerSheave: number;
  blockWllLb: number | null;
  lineWllLb: number | null;
  slingWllLb: number | null;
  /** Sling legs sharing the load (default 1). */
  slingLegs: number;
  /** Sling angle from the horizontal, 1-90 degrees (default 90: a vertical leg). */
  slingAngleDeg: number;
}

export const LIFT_DEFAULTS = { frictionPerSheave: 0.1, slingLegs: 1, slingAngleDeg: 90 } as const;

/** The site and system fields a work order may carry for the field figures. */
export interface SiteFields {
  /** Site elevation above sea level in metres (default 0). */
  altitudeM?: number;
  /** 1 = single-phase (voltageKv is the voltage to ground), otherwise multiphase (default 3). */
  phases?: number;
  /** The phase-to-phase voltage of the system a single-phase line is tapped from, when known. */
  systemKv?: number | null;
  /** The planned lift, if any. */
  lift?: Lift | null;
}

/** Minimum approach distance for an order (see approach.ts). */
export type Approach =
  | {
      meters: number;
      feet: number;
      altitudeFactor: number;
      exposure: "phase_to_ground";
      source: string;
    }
  | { avoidContact: true }
  | { engineering: true };

export interface LiftFigures {
  leadLinePullLb: number;
  blockLoadLb: number;
  slingLegLb: number;
  source: string;
}

/** One entry of the report's `orders` array. */
export interface OrderFigures {
  workOrderId: string;
  approach: Approach | null;
  lift: LiftFigures | null;
}
