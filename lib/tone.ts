// The tones a state is shown in, as data: lib/ says which tone a state has (an order's status,
// a finding's level), components/status.tsx draws it (icon, word and colour tokens).
// "overridden" is drawn with the colour token still named `waived` in tailwind.config.ts.
export const TONES = ["block", "warn", "clear", "info", "overridden", "muted"] as const;
export type Tone = (typeof TONES)[number];
