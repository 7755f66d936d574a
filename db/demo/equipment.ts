// The demo cooperative's trucks and trailers (invented unit numbers and names), per yard, with
// the rigging each carries. Dates are days relative to the seed day ("-200" = 200 days ago).
import type { EquipmentKind, Licence, RiggingKind } from "@/lib/equipment/model";

export interface DemoRigging {
  kind: RiggingKind;
  label: string;
  partsOfLine?: number;
  sheaves?: number;
  wllLb: number;
  inspectedDaysAgo: number;
}

export interface DemoEquipment {
  yard: "NOR" | "MES";
  unit: string;
  name: string;
  kind: EquipmentKind;
  insulated: boolean;
  /** Days before the seed day of the last dielectric test (aerial devices); null = none. */
  dielectricDaysAgo: number | null;
  inspectionDaysAgo: number | null;
  licence: Licence | null;
  outOfService?: string;
  rigging: DemoRigging[];
  /** Booked on this demo order tomorrow. */
  bookedOn?: string;
}

const blocks = (label: string, parts: number, wll: number, ago: number): DemoRigging => ({ kind: "rope_block", label, partsOfLine: parts, sheaves: parts, wllLb: wll, inspectedDaysAgo: ago });
const line = (label: string, wll: number, ago: number): DemoRigging => ({ kind: "hand_line", label, wllLb: wll, inspectedDaysAgo: ago });
const sling = (label: string, wll: number, ago: number): DemoRigging => ({ kind: "sling", label, wllLb: wll, inspectedDaysAgo: ago });

export const DEMO_EQUIPMENT: DemoEquipment[] = [
  // North Yard
  {
    yard: "NOR", unit: "N-314", name: "Bluestem 55 ft insulated bucket", kind: "bucket_truck", insulated: true,
    dielectricDaysAgo: 120, inspectionDaysAgo: 140, licence: "cdl_b",
    rigging: [blocks("3-part rope blocks, 5/8 in.", 3, 2000, 30), line("Hand line 1/2 in. double braid", 450, 30), sling("Round sling, purple", 1000, 45)],
  },
  {
    yard: "NOR", unit: "N-322", name: "Harrow 45 ft insulated bucket", kind: "bucket_truck", insulated: true,
    dielectricDaysAgo: 200, inspectionDaysAgo: 210, licence: "cdl_b",
    rigging: [blocks("2-part rope blocks, 1/2 in.", 2, 1500, 60), line("Hand line 1/2 in.", 450, 60), sling("Web sling 1 in.", 800, 60)],
  },
  {
    yard: "NOR", unit: "N-407", name: "Millrace digger derrick", kind: "digger_derrick", insulated: false,
    dielectricDaysAgo: 90, inspectionDaysAgo: 95, licence: "cdl_a", bookedOn: "WO-26-0103",
    rigging: [blocks("4-part rope blocks, 3/4 in.", 4, 4000, 20), line("Hand line 5/8 in.", 600, 20), sling("Chain sling, grade 80", 3000, 20)],
  },
  {
    yard: "NOR", unit: "N-118", name: "Crew pickup, Sorghum", kind: "pickup", insulated: false,
    dielectricDaysAgo: null, inspectionDaysAgo: 100, licence: null,
    rigging: [line("Hand line 1/2 in.", 450, 75)],
  },
  {
    yard: "NOR", unit: "N-126", name: "Crew pickup, Dunmore", kind: "pickup", insulated: false,
    dielectricDaysAgo: null, inspectionDaysAgo: 30, licence: null,
    rigging: [line("Hand line 1/2 in.", 450, 15)],
  },
  {
    yard: "NOR", unit: "N-502", name: "Pole trailer, 40 ft", kind: "trailer", insulated: false,
    dielectricDaysAgo: null, inspectionDaysAgo: 60, licence: "cdl_a",
    rigging: [sling("Pole choker sling", 2000, 60)],
  },
  {
    yard: "NOR", unit: "N-330", name: "Tallgrass 40 ft bucket", kind: "bucket_truck", insulated: true,
    dielectricDaysAgo: 300, inspectionDaysAgo: 320, licence: "cdl_b",
    outOfService: "Boom hydraulic leak found at the pre-trip inspection; at the shop",
    rigging: [blocks("2-part rope blocks, 1/2 in.", 2, 1500, 90), line("Hand line 1/2 in.", 450, 90)],
  },
  // Mesa Yard
  {
    yard: "MES", unit: "M-341", name: "Caprock 50 ft insulated bucket", kind: "bucket_truck", insulated: true,
    // Overdue on purpose: the demo shows the EQUIPMENT finding on WO-26-0111.
    dielectricDaysAgo: 400, inspectionDaysAgo: 150, licence: "cdl_b", bookedOn: "WO-26-0111",
    rigging: [blocks("3-part rope blocks, 5/8 in.", 3, 2000, 40), line("Hand line 1/2 in. double braid", 450, 40), sling("Round sling, green", 1400, 40)],
  },
  {
    yard: "MES", unit: "M-349", name: "Juniper 45 ft insulated bucket", kind: "bucket_truck", insulated: true,
    dielectricDaysAgo: 45, inspectionDaysAgo: 50, licence: "cdl_b",
    rigging: [blocks("3-part rope blocks, 5/8 in.", 3, 2000, 10), line("Hand line 1/2 in.", 450, 10), sling("Round sling, purple", 1000, 10)],
  },
  {
    yard: "MES", unit: "M-412", name: "Redrock digger derrick", kind: "digger_derrick", insulated: false,
    dielectricDaysAgo: 150, inspectionDaysAgo: 160, licence: "cdl_a",
    rigging: [blocks("4-part rope blocks, 3/4 in.", 4, 4000, 35), line("Hand line 5/8 in.", 600, 35), sling("Chain sling, grade 80", 3000, 35)],
  },
  {
    yard: "MES", unit: "M-133", name: "Crew pickup, Piñon", kind: "pickup", insulated: false,
    dielectricDaysAgo: null, inspectionDaysAgo: 80, licence: null,
    rigging: [line("Hand line 1/2 in.", 450, 80)],
  },
  {
    yard: "MES", unit: "M-508", name: "Reel trailer", kind: "trailer", insulated: false,
    dielectricDaysAgo: null, inspectionDaysAgo: 200, licence: "cdl_a",
    rigging: [sling("Reel bar sling", 2500, 100)],
  },
];
