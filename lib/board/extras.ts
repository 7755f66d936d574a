import type { Knex } from "knex";
import type { BoardPayload } from "./types";

// Hooks other parts of the product add to the board load: recurring orders materialised for
// the day before it is read, tonight's on-call people marked in the pool after.
export const boardExtras = {
  async beforeLoad(_db: Knex, _organisationId: number, _yardId: number, _day: string) {},
  async afterLoad(_db: Knex, _payload: BoardPayload) {},
};
