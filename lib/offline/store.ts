// The queue's IndexedDB store (through idb) and the owner of the phone's offline data, in the
// browser only. One database, QUEUE_DB: "actions" (auto-increment key = order of entry) and
// "meta" (who the cached pages and the queue belong to).
import { deleteDB, openDB, type IDBPDatabase } from "idb";
import { QUEUE_DB } from "./model";
import type { QueuedAction, QueueStore } from "./queue";

let opened: Promise<IDBPDatabase> | null = null;
/** Set by sign-out: this page opens the database no more (opening would create it again). */
let deleted = false;

function database() {
  if (deleted) return Promise.reject(new Error("the phone's queue was deleted at sign-out"));
  opened ??= openDB(QUEUE_DB, 1, {
    upgrade(db) {
      db.createObjectStore("actions", { keyPath: "seq", autoIncrement: true });
      db.createObjectStore("meta");
    },
    blocking() {
      // Another tab deletes the database (sign-out): let it.
      void opened?.then((d) => d.close());
      opened = null;
    },
  });
  return opened;
}

export const idbStore: QueueStore = {
  async add(action) {
    const { seq: _seq, ...rest } = action;
    return Number(await (await database()).add("actions", rest));
  },
  async all() {
    return (await (await database()).getAll("actions")) as QueuedAction[];
  },
  async put(action) {
    await (await database()).put("actions", action);
  },
  async remove(seq) {
    await (await database()).delete("actions", seq);
  },
};

export async function getOwner(): Promise<number | null> {
  const v = await (await database()).get("meta", "owner");
  return typeof v === "number" ? v : null;
}

export async function setOwner(userId: number) {
  await (await database()).put("meta", userId, "owner");
}

/** Deletes the whole database (sign-out). */
export async function deleteQueueDatabase() {
  deleted = true;
  const d = opened;
  opened = null;
  if (d) (await d.catch(() => null))?.close();
  // Deleting waits for other connections to close (their `blocking` handler closes them); check
  // that it is gone and try again if something still held it.
  for (let attempt = 0; attempt < 3; attempt++) {
    await deleteDB(QUEUE_DB);
    const names = typeof indexedDB.databases === "function" ? (await indexedDB.databases()).map((x) => x.name) : [];
    if (!names.includes(QUEUE_DB)) return;
    await new Promise((r) => setTimeout(r, 200));
  }
}
