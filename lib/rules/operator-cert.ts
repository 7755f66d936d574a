// OPERATOR_CERT: operators hold an equipment operator credential; drivers hold the licence
// class the truck needs (a class A licence also covers class B).

import { finding, who, type RuleCheck } from "./common";
import { requiredDriverLicence } from "./equipment";
import type { Finding } from "./types";

export const OPERATOR_CERT_SOURCE = "employer policy; 49 CFR 383 for licence classes";

export const operatorCert: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    const { people, positionsOf } = ix.crew(order.id);
    // With equipment on the order: the highest licence any of it requires (null = none needed).
    const licence = requiredDriverLicence(order, ix);
    for (const w of people) {
      const positions = positionsOf.get(w.id)!;
      const problems: string[] = [];
      if (positions.has("operator") && !ix.holdsThrough(w, "equipment_operator", order)) {
        problems.push("has no equipment operator credential valid on every day of the order");
      }
      if (positions.has("driver") && licence !== null) {
        const ok = ix.holdsThrough(w, "cdl_a", order) || (licence === "cdl_b" && ix.holdsThrough(w, "cdl_b", order));
        if (!ok) {
          problems.push(
            `has no ${licence === "cdl_a" ? "class A" : "class A or B"} commercial driver's licence valid on every day of the order (the truck needs ${licence === "cdl_a" ? "class A" : "class B"})`,
          );
        }
      }
      if (problems.length > 0) {
        out.push(
          finding(
            "OPERATOR_CERT",
            "block",
            order,
            w.id,
            `${who(w)} ${problems.join(" and ")}. Record a current credential or assign someone who holds one.`,
            OPERATOR_CERT_SOURCE,
          ),
        );
      }
    }
  }
  return out;
};
