// The job briefing (with the pole check) and each crew member's acknowledgement with their
// gear check: one schema per boundary, shared by the briefing form (react-hook-form +
// zodResolver), the route handlers in app/api/briefings/** and the tests. Pure.
//
// Sources, as cited on the screen:
// - job briefing before each job, again when conditions change: 29 CFR 1910.269(c)(1)–(c)(3);
//   its subjects (hazards, work procedures, special precautions, energy-source controls,
//   protective equipment): 1910.269(c)(2);
// - the pole check before anyone climbs: 1910.269(q)(1)(i) and Appendix D (methods of
//   inspecting and testing wood poles: visual inspection, sounding with a hammer, rocking,
//   the ground line); digging about 6 in. on at least two sides and probing at an angle is
//   common practice;
// - the default drop zone radius of 15 ft (4.6 m) is common practice;
// - rubber insulating gloves tested within 6 months, sleeves within 12 months: 1910.137,
//   Table I-5 (recalled from memory).
import { z } from "zod";

export const HAZARDS = [
  { key: "energized", label: "Energized parts", hint: "Parts in reach, their voltage, minimum approach distance, cover-up" },
  { key: "traffic", label: "Traffic", hint: "Road, shoulder, signs and cones, a flagger" },
  { key: "weather", label: "Weather", hint: "Wind, lightning, ice, heat, footing" },
  { key: "other", label: "Other", hint: "Trees, dogs, underground, public nearby, backfeed" },
] as const;
export type HazardKey = (typeof HAZARDS)[number]["key"];

export const CONTROLS = [
  { key: "isolating_devices", label: "Isolating devices open, tagged" },
  { key: "tested_deenergized", label: "Tested de-energized" },
  { key: "grounds", label: "Protective grounds installed" },
  { key: "hot_line_tag", label: "Hot-line tag / reclosing off on the feeder" },
  { key: "cover_up", label: "Cover-up on energized parts in reach" },
] as const;
export type ControlKey = (typeof CONTROLS)[number]["key"];

export const POLE_MATERIALS = ["wood", "steel", "concrete", "composite"] as const;
export type PoleMaterial = (typeof POLE_MATERIALS)[number];

export const POLE_CHECKS = [
  {
    key: "visual",
    label: "A look from top to bottom",
    hint: "Cracks across the grain, woodpecker holes and hollows, shell rot, burn marks, knots at one height, a former ground line above today's, leaning or buckling at the ground line",
    woodOnly: false,
  },
  {
    key: "spans",
    label: "Neighbouring spans",
    hint: "The spans either side: conductors, insulators, ties and hardware; nothing loose, burned or damaged",
    woodOnly: false,
  },
  { key: "guys", label: "Guys and anchors", hint: "Guys tight and whole, anchors holding, no pulled rod or slack", woodOnly: false },
  {
    key: "unbalanced_load",
    label: "Load the work will leave",
    hint: "The unbalanced load that removing or re-tensioning conductors will leave on the pole; guy or brace for it first",
    woodOnly: false,
  },
  { key: "voltage_test", label: "Voltage test of pole and guys", hint: "Test the pole and the guys for voltage before anyone touches them", woodOnly: false },
  {
    key: "sound_test",
    label: "Sound test with a hammer",
    hint: "Rap sharply from the ground line up to about 6 ft, all the way round; a dull or hollow sound means decay",
    woodOnly: true,
  },
  {
    key: "rocking_test",
    label: "Rocking test",
    hint: "Push the pole back and forth across the line (pike pole or rope, from a safe distance); watch the conductors; a crack means reject",
    woodOnly: true,
  },
  {
    key: "ground_line",
    label: "Ground line",
    hint: "Wood: on at least two sides, dig about 6 in. and probe at an angle for rot and soft wood. Steel: dig back and look for rust, pitting and thinned or holed metal at and just below the ground line. Concrete: cracks, spalling and exposed or rusting rebar at the ground line. Composite: cracks, splits or crushing at the ground line",
    woodOnly: false,
  },
] as const;

/**
 * The ground-line check differs by pole material (common practice; Appendix D to 1910.269
 * covers wood poles only): wood rots just below the ground line, steel corrodes there,
 * concrete cracks and spalls until the rebar shows.
 */
export const GROUND_LINE_HINTS: Record<PoleMaterial, string> = {
  wood: "On at least two sides, dig about 6 in. and probe at an angle for rot and soft wood",
  steel: "Dig back about 6 in. and look for rust, pitting and thinned or holed metal at and just below the ground line; tap doubtful spots",
  concrete: "Look for cracks, spalling and exposed or rusting rebar at and just below the ground line; dig back where the soil hides it",
  composite: "Look for cracks, splits, crushing or a loose pole at the ground line",
};

/** The hint for one pole check on a pole of this material. */
export function poleCheckHint(key: PoleCheckKey, material: string | undefined): string {
  if (key === "ground_line" && material && material in GROUND_LINE_HINTS) return GROUND_LINE_HINTS[material as PoleMaterial];
  return POLE_CHECKS.find((c) => c.key === key)?.hint ?? "";
}
export type PoleCheckKey = (typeof POLE_CHECKS)[number]["key"];
export const POLE_CHECK_KEYS = POLE_CHECKS.map((c) => c.key) as PoleCheckKey[];

export const CHECK_RESULTS = ["pass", "fail", "na"] as const;
export type CheckResult = (typeof CHECK_RESULTS)[number];

/** What the trade does when a pole fails its check. */
export const FAIL_ACTIONS = [
  { key: "secure", label: "Secure the pole first, then work", hint: "Line-truck boom, temporary guys or ropes, or a new pole lashed alongside (work from the new one)" },
  { key: "bucket", label: "Work from a bucket instead", hint: "Nobody climbs this pole" },
  { key: "hold", label: "Hold the order", hint: "Dispatch is told by text and e-mail; nobody starts" },
] as const;
export type FailAction = (typeof FAIL_ACTIONS)[number]["key"];

export const DEFAULT_DROP_ZONE_FT = 15;
export const FT_TO_M = 0.3048;

const text = (max: number) => z.string().trim().max(max, `At most ${max} characters`).default("");
const workerId = z.number().int().positive().nullable().default(null);

const hazard = z.object({ present: z.boolean().default(false), notes: text(500) });

const poleItem = z.object({
  result: z.enum(CHECK_RESULTS, { error: "Pick pass, fail or n/a" }).nullable().default(null),
  notes: text(500),
  photoFileId: z.number().int().positive().nullable().default(null),
});

/** The saved briefing (a draft may be incomplete). */
export const briefingDataSchema = z.object({
  hazards: z
    .object({
      energized: hazard.prefault({}),
      traffic: hazard.prefault({}),
      weather: hazard.prefault({}),
      other: hazard.prefault({}),
    })
    .prefault({}),
  dropZone: z
    .object({
      radiusFt: z
        .number({ error: "Enter the radius in feet" })
        .min(DEFAULT_DROP_ZONE_FT, `At least ${DEFAULT_DROP_ZONE_FT} ft`)
        .max(300, "At most 300 ft")
        .default(DEFAULT_DROP_ZONE_FT),
      /** Why it is larger than the default (height, load, boom swing). */
      reason: text(300),
      /** Who may enter the zone while someone is aloft (worker ids from the crew). */
      entrants: z.array(z.number().int().positive()).max(20).default([]),
      notes: text(300),
    })
    .prefault({}),
  procedure: z
    .object({
      steps: text(2000),
      precautions: text(1000),
    })
    .prefault({}),
  controls: z
    .object({
      isolating_devices: z.boolean().default(false),
      tested_deenergized: z.boolean().default(false),
      grounds: z.boolean().default(false),
      hot_line_tag: z.boolean().default(false),
      cover_up: z.boolean().default(false),
      notes: text(1000),
    })
    .prefault({}),
  poleCheck: z
    .object({
      material: z.enum(POLE_MATERIALS).default("wood"),
      items: z
        .object({
          visual: poleItem.prefault({}),
          spans: poleItem.prefault({}),
          guys: poleItem.prefault({}),
          unbalanced_load: poleItem.prefault({}),
          voltage_test: poleItem.prefault({}),
          sound_test: poleItem.prefault({}),
          rocking_test: poleItem.prefault({}),
          ground_line: poleItem.prefault({}),
        })
        .prefault({}),
      /** After a failed item: what the crew does about it. */
      failAction: z.enum(["secure", "bucket", "hold"]).nullable().default(null),
      failActionNotes: text(500),
    })
    .prefault({}),
  emergency: z
    .object({
      hospital: text(160),
      hospitalAddress: text(255),
      /** Who calls 911. */
      callerWorkerId: workerId,
      /** Who does the rescue (pole-top or aerial). */
      rescuerWorkerId: workerId,
      notes: text(500),
    })
    .prefault({}),
});

export type BriefingData = z.output<typeof briefingDataSchema>;
export type BriefingFormValues = z.input<typeof briefingDataSchema>;

/** An empty briefing with every default filled in. */
export const emptyBriefing = (): BriefingData => briefingDataSchema.parse({});

export function failedChecks(d: BriefingData): PoleCheckKey[] {
  return POLE_CHECK_KEYS.filter((k) => d.poleCheck.items[k].result === "fail");
}

/** Every item has a pass (or n/a where that is allowed): the pole may be climbed. */
export function poleCheckPasses(d: BriefingData): boolean {
  return POLE_CHECKS.every((c) => {
    const r = d.poleCheck.items[c.key].result;
    return r === "pass" || (r === "na" && c.woodOnly && d.poleCheck.material !== "wood");
  });
}

/** Failed items that the crew has dealt with by securing the pole or switching to a bucket. */
export function failuresResolved(d: BriefingData): boolean {
  const failed = failedChecks(d);
  return failed.length > 0 && (d.poleCheck.failAction === "secure" || d.poleCheck.failAction === "bucket") && d.poleCheck.failActionNotes.length > 0;
}

/**
 * What completing a briefing needs, as issues on the fields. `crew` is the order's crew
 * (worker ids and positions), so the 911 caller, the rescuer and the zone's entrants are
 * people who are really there.
 */
export function completionIssues(d: BriefingData, crew: { workerId: number; position: string }[]) {
  const issues: { field: string; message: string }[] = [];
  const add = (field: string, message: string) => issues.push({ field, message });
  const ids = new Set(crew.map((c) => c.workerId));
  for (const h of HAZARDS) {
    const v = d.hazards[h.key];
    if (v.present && !v.notes) add(`hazards.${h.key}.notes`, `Say what the ${h.label.toLowerCase()} hazard is and how the crew handles it`);
  }
  if (d.dropZone.radiusFt > DEFAULT_DROP_ZONE_FT && !d.dropZone.reason) add("dropZone.reason", "Say why the zone is larger (height, load, boom swing)");
  if (d.dropZone.entrants.some((w) => !ids.has(w))) add("dropZone.entrants", "Only people on this crew may be named");
  if (!d.procedure.steps) add("procedure.steps", "Write the work procedure in a few lines");
  const anyControl = CONTROLS.some((c) => d.controls[c.key]);
  if (!anyControl && !d.controls.notes) add("controls.notes", "Name the energy-source controls, or say why none are needed");
  for (const c of POLE_CHECKS) {
    const item = d.poleCheck.items[c.key];
    if (!item.result) add(`poleCheck.items.${c.key}.result`, "Record pass or fail");
    else if (item.result === "na" && (!c.woodOnly || d.poleCheck.material === "wood")) {
      add(`poleCheck.items.${c.key}.result`, c.woodOnly ? "Wood poles need this test" : "Every pole needs this check");
    } else if (item.result === "fail" && !item.notes) add(`poleCheck.items.${c.key}.notes`, "Say what failed");
  }
  if (failedChecks(d).length) {
    if (d.poleCheck.failAction === "hold") add("poleCheck.failAction", "A held order is not completed: use Hold the order");
    else if (!d.poleCheck.failAction) add("poleCheck.failAction", "The pole failed a check: secure it first, work from a bucket, or hold the order");
    else if (!d.poleCheck.failActionNotes) add("poleCheck.failActionNotes", "Say how the pole is secured or how the work is done instead");
  }
  if (!d.emergency.hospital) add("emergency.hospital", "Name the nearest hospital");
  if (!d.emergency.hospitalAddress) add("emergency.hospitalAddress", "Give the hospital's address");
  if (!d.emergency.callerWorkerId) add("emergency.callerWorkerId", "Pick who calls 911");
  else if (!ids.has(d.emergency.callerWorkerId)) add("emergency.callerWorkerId", "Pick someone on this crew");
  if (!d.emergency.rescuerWorkerId) add("emergency.rescuerWorkerId", "Pick who does the rescue");
  else if (!ids.has(d.emergency.rescuerWorkerId)) add("emergency.rescuerWorkerId", "Pick someone on this crew");
  else {
    const climbers = crew.filter((c) => c.position === "climber").map((c) => c.workerId);
    if (climbers.length === 1 && climbers[0] === d.emergency.rescuerWorkerId) {
      add("emergency.rescuerWorkerId", "The rescuer must be someone other than the climber");
    }
  }
  return issues;
}

/** PUT /api/briefings/[orderId]. */
export const briefingPutSchema = z.discriminatedUnion("action", [
  z.object({ action: z.literal("save"), version: z.number().int().min(0), data: briefingDataSchema }),
  z.object({ action: z.literal("complete"), version: z.number().int().min(0), data: briefingDataSchema }),
  z.object({
    action: z.literal("rebrief"),
    version: z.number().int().min(0),
    reason: z.string({ error: "Say what changed" }).trim().min(3, "Say what changed").max(500, "At most 500 characters"),
  }),
]);
export type BriefingPut = z.output<typeof briefingPutSchema>;

/** POST /api/briefings/[orderId]/hold: the lead holds the order (usually after a failed pole check). */
export const briefingHoldSchema = z.object({
  version: z.number().int().min(0),
  data: briefingDataSchema,
  reason: z.string({ error: "Give the reason for the hold" }).trim().min(3, "Give the reason for the hold").max(400, "At most 400 characters"),
});
export type BriefingHold = z.output<typeof briefingHoldSchema>;

/** DELETE /api/briefings/[orderId]/hold: dispatch lifts the hold (pole replaced or secured). */
export const briefingLiftSchema = z.object({
  note: z.string({ error: "Say what was done" }).trim().min(3, "Say what was done").max(500, "At most 500 characters"),
});

// --- the crew member's acknowledgement and gear check ----------------------------------------

export const GEAR = [
  { key: "belt", label: "Body belt / harness", short: "belt", climbing: true },
  { key: "fallArrest", label: "Lanyard, fall-arrest or fall-restriction device", short: "fall arrest", climbing: true },
  { key: "climbers", label: "Climbers: gaffs sharp and sound, straps good", short: "climbers", climbing: true },
  { key: "hardHat", label: "Hard hat (class E)", short: "hard hat", climbing: false },
  { key: "frClothing", label: "FR clothing for the arc rating", short: "FR clothing", climbing: false },
] as const;
export type GearKey = (typeof GEAR)[number]["key"];

const gearResult = z.enum(["ok", "na"], { error: "Mark it OK, or not used today. Gear that is not OK is replaced before work." });
const rubber = z.object({
  result: gearResult,
  /** The date stamped on the gloves or sleeves (last electrical test). */
  testedOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Enter the test date as YYYY-MM-DD").nullable().default(null),
});

const gearBase = z.object({
  gloves: rubber,
  sleeves: rubber,
  belt: gearResult,
  fallArrest: gearResult,
  climbers: gearResult,
  hardHat: gearResult,
  frClothing: gearResult,
  notes: text(300),
});
export type GearCheck = z.output<typeof gearBase>;
export type GearCheckValues = z.input<typeof gearBase>;

const monthsBefore = (date: string, months: number) => {
  const [y, m, d] = date.split("-").map(Number);
  const t = new Date(Date.UTC(y, m - 1 - months, d));
  return t.toISOString().slice(0, 10);
};

/**
 * The gear check for one person. `workDate` (the order's day) checks the rubber goods' test
 * dates: gloves within 6 months, sleeves within 12 (1910.137 Table I-5); `climbing` (their
 * position climbs) makes belt, fall arrest and climbers required.
 */
export function gearCheckSchema(opts: { workDate?: string; climbing?: boolean } = {}) {
  return gearBase.superRefine((g, ctx) => {
    for (const [key, months, what] of [
      ["gloves", 6, "Gloves"],
      ["sleeves", 12, "Sleeves"],
    ] as const) {
      const v = g[key];
      if (v.result !== "ok") continue;
      if (!v.testedOn) {
        ctx.addIssue({ code: "custom", path: [key, "testedOn"], message: "Enter the test date stamped on them" });
        continue;
      }
      if (opts.workDate) {
        if (v.testedOn > opts.workDate) ctx.addIssue({ code: "custom", path: [key, "testedOn"], message: "That date is after the work day" });
        else if (v.testedOn < monthsBefore(opts.workDate, months)) {
          ctx.addIssue({ code: "custom", path: [key, "testedOn"], message: `${what} are out of test (more than ${months} months); get a tested pair before work` });
        }
      }
    }
    if (opts.climbing) {
      for (const gkey of ["belt", "fallArrest", "climbers"] as const) {
        if (g[gkey] !== "ok") ctx.addIssue({ code: "custom", path: [gkey], message: "You climb today: this must be checked OK" });
      }
    }
  });
}

/** POST /api/briefings/[orderId]/ack. `workerId` other than one's own: the lead records an in-person acknowledgement. */
export const ackSchema = z.object({
  round: z.number({ error: "round is required" }).int().positive(),
  workerId: z.number().int().positive().optional(),
  gearCheck: gearBase,
});
export type AckInput = z.output<typeof ackSchema>;

/** POST /api/briefings/[orderId]/start. */
export const startSchema = z.object({ round: z.number().int().positive() });

export interface BriefingView {
  order: OrderFacts;
  crew: CrewMember[];
  leadWorkerId: number | null;
  /** The current round, or null before the lead first saves. */
  briefing: RoundView | null;
  /** The current round's data, or a draft filled in from the order. */
  data: BriefingData;
  acks: AckView[];
  /** Crew members who have not acknowledged the current round. */
  pending: CrewMember[];
  history: { round: number; state: string; completedAt: string | null; reason: string | null }[];
  start: { allowed: boolean; reason: string | null };
}

export interface CrewMember {
  workerId: number;
  name: string;
  employeeNo: string;
  classification: string;
  positions: string[];
  positionLabel: string;
  phone: string | null;
  email: string | null;
  assignmentStatus: string;
  /** Has a sign-in of their own (can acknowledge from their phone). */
  hasSignIn: boolean;
  climbs: boolean;
}

export interface OrderFacts {
  id: number;
  organisationId: number;
  number: string;
  title: string;
  address: string | null;
  structureNo: string | null;
  start: string;
  end: string;
  workDate: string;
  timezone: string;
  yardId: number;
  yardCode: string;
  yardName: string;
  energized: boolean;
  voltageKv: number | null;
  /** Issue 14: a single-phase tap (phases 1, its system voltage) and live parts beside de-energized work. */
  phases: number;
  systemKv: number | null;
  nearEnergizedKv: number | null;
  status: string;
  holdReason: string | null;
  briefingState: string;
  actualStartAt: string | null;
  workTypeName: string;
  ruleType: string;
  notes: string | null;
  version: number;
}

export interface AckView {
  workerId: number;
  name: string;
  acknowledgedAt: string;
  gearCheck: GearCheck | null;
  inPerson: boolean;
  recordedBy: string | null;
}

export interface RoundView {
  id: number;
  round: number;
  state: "draft" | "briefed" | "on_hold";
  version: number;
  leadWorkerId: number | null;
  completedAt: string | null;
  updatedAt: string;
  updatedBy: string | null;
  reason: string | null;
  holdPrevStatus: string | null;
}
