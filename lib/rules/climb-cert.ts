// CLIMB_CERT: everyone in a climber position holds a climbing qualification valid on every day
// of the order, its last day included (Corrections 6); one that lapses soon after the first day
// is a warning.

import { dateWords, finding, plural, who, type RuleCheck } from "./common";
import { daysBetween } from "./time";
import type { Finding } from "./types";

export const CLIMB_CERT_SOURCE =
  "employer qualification under 29 CFR 1910.269(a)(2); OSHA sets no renewal period, so the warning window is policy";

/**
 * The warning window counts back from the order's start date: a qualification whose last
 * valid day is fewer than credentialWarnDays days after the start date warns. With 30 days
 * and a start on 2027-04-06, expiry 2027-04-06 (0 days) through 2027-05-05 (29 days) warns;
 * 2027-05-06 (30 days) is clear. With credentialWarnDays 0 nothing warns.
 */
export function inWarningWindow(expiresOn: string, startDate: string, warnDays: number): boolean {
  return daysBetween(startDate, expiresOn) < warnDays;
}

export const climbCert: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  const warnDays = ix.policy.credentialWarnDays;
  for (const order of orders) {
    const last = ix.lastDay(order);
    const multiDay = last !== order.startDate;
    for (const w of ix.crew(order.id).holders.get("climber") ?? []) {
      const exp = ix.expiryOf(w, "climbing");
      if (exp === undefined) {
        out.push(
          finding(
            "CLIMB_CERT",
            "block",
            order,
            w.id,
            `${who(w)} has no climbing qualification on record. Record a current climbing evaluation or assign another climber.`,
            CLIMB_CERT_SOURCE,
          ),
        );
      } else if (exp !== null && exp < order.startDate) {
        out.push(
          finding(
            "CLIMB_CERT",
            "block",
            order,
            w.id,
            `${who(w)}'s climbing qualification expired on ${dateWords(exp)}, before the order starts on ${dateWords(order.startDate)}. ` +
              "Renew the climbing evaluation or assign another climber.",
            CLIMB_CERT_SOURCE,
          ),
        );
      } else if (exp !== null && exp < last) {
        out.push(
          finding(
            "CLIMB_CERT",
            "block",
            order,
            w.id,
            `${who(w)}'s climbing qualification expires on ${dateWords(exp)}, before the order's last day, ${dateWords(last)}. ` +
              "It must be valid on every day of the order: renew the climbing evaluation or assign another climber.",
            CLIMB_CERT_SOURCE,
          ),
        );
      } else if (exp !== null && inWarningWindow(exp, order.startDate, warnDays)) {
        out.push(
          finding(
            "CLIMB_CERT",
            "warn",
            order,
            w.id,
            `${who(w)}'s climbing qualification expires on ${dateWords(exp)}, within ${plural(warnDays, "day")} of the order's ${multiDay ? "first day" : "start"}, ${dateWords(order.startDate)}. ` +
              "Schedule the renewal.",
            CLIMB_CERT_SOURCE,
          ),
        );
      }
    }
  }
  return out;
};
