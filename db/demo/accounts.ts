// Demo sign-ins created by db/seeds/01_demo.ts. Fictional people, local demo only; scripts
// print this list so whoever runs the demo can sign in. Never use these outside a demo.

export type DemoRole = "admin" | "dispatcher" | "supervisor" | "hr" | "lineworker";

export interface DemoAccount {
  role: DemoRole;
  email: string;
  password: string;
  name: string;
}

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { role: "admin", email: "admin@cedarprairie.example", password: "admin-cedar-26", name: "Avery Lindholm" },
  { role: "dispatcher", email: "dispatch@cedarprairie.example", password: "board-north-26", name: "Corinne Maddox" },
  { role: "dispatcher", email: "dispatch.mesa@cedarprairie.example", password: "board-mesa-26", name: "Felipe Ortega" },
  { role: "supervisor", email: "super@cedarprairie.example", password: "override-26", name: "Glenn Harrower" },
  { role: "hr", email: "hr@cedarprairie.example", password: "creds-cedar-26", name: "Nadine Okonkwo" },
  // Signs in as the North crew lead Marcus Whitfield (CP-1001), who leads WO-26-0101 tomorrow.
  { role: "lineworker", email: "marcus.whitfield@cedarprairie.example", password: "lineworker-26", name: "Marcus Whitfield" },
];
