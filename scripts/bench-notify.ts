// The outbox benchmark: queues 1,000 notifications (texts and e-mails) and drains them against
// the local fakes (real HTTP to the SMS fake, real SMTP to the mail fake) with two delivery
// loops on two connection pools, as two app instances would. Prints messages per second and
// how many were sent, failed and duplicated (duplicates counted at the fakes).
//
//   npm run bench:notify                  (the fakes must be running: scripts/start or scripts/test
//   npm run bench:notify -- --count 2000 --loops 4 --keep      starts them)
//
// Reads DB_NAME, TWILIO_*, SMTP_*, MAIL_FAKE_HTTP_PORT like the app. An app server on the same
// database drains the same rows too; that is fine (it is one more instance), the figures then
// cover both.
import knex, { type Knex } from "knex";
import { dbConfig } from "../knexfile";
import { drainOnce, enqueue, type OutboxInput } from "../lib/notify/data-outbox";
import { closeEmailTransport } from "../lib/notify/email";

function arg(name: string, fallback: number) {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
}

const COUNT = arg("count", 1000);
const LOOPS = arg("loops", 2);
const EMAIL_SHARE = arg("email-share", 0.3);
const KEEP = process.argv.includes("--keep");
const SMS = (process.env.TWILIO_API_BASE || `http://127.0.0.1:${process.env.SMS_FAKE_PORT ?? 4010}`).replace(/\/$/, "");
const MAILBOX = `http://127.0.0.1:${process.env.MAIL_FAKE_HTTP_PORT ?? 4020}`;

async function json<T>(url: string): Promise<T> {
  const r = await fetch(url);
  if (!r.ok) throw new Error(`${url}: ${r.status}`);
  return (await r.json()) as T;
}

async function main() {
  if (!process.env.TWILIO_API_BASE) throw new Error("TWILIO_API_BASE is not set: the benchmark only runs against the local SMS fake.");
  await json(`${SMS}/_fake/health`).catch(() => {
    throw new Error(`the SMS fake is not answering at ${SMS} (start the fakes: node --import tsx scripts/fakes/run.ts)`);
  });
  await json(`${MAILBOX}/api/health`).catch(() => {
    throw new Error(`the mail fake is not answering at ${MAILBOX}`);
  });

  const pools: Knex[] = Array.from({ length: LOOPS + 1 }, () => knex({ ...dbConfig(), pool: { min: 0, max: 12 } }));
  const db = pools[0];
  const tag = `bench-${Date.now().toString(36)}`;
  try {
    const org = await db("organisations").orderBy("id").first("id");
    if (!org) throw new Error("no organisation in the database: run scripts/db.ts seed first");
    const emails = Math.round(COUNT * EMAIL_SHARE);
    const rows: OutboxInput[] = Array.from({ length: COUNT }, (_, i) => {
      const email = i % Math.round(1 / EMAIL_SHARE) === 0 && i / Math.round(1 / EMAIL_SHARE) < emails;
      return email
        ? {
            organisationId: org.id,
            channel: "email",
            kind: "bench",
            to: `bench${i}@gaffline.invalid`,
            subject: `Benchmark ${i} ${tag}`,
            body: `Benchmark message ${i} (${tag}). Nothing to do.`,
            dedupeKey: `${tag}:${i}`,
          }
        : {
            organisationId: org.id,
            channel: "sms",
            kind: "bench",
            to: `+1320555${String(i % 10000).padStart(4, "0")}`,
            body: `Gaffline benchmark ${i} (${tag}). Nothing to do.`,
            dedupeKey: `${tag}:${i}`,
          };
    });
    const texts = rows.filter((r) => r.channel === "sms").length;
    const mails = COUNT - texts;
    await enqueue(db, rows);
    const ids = (await db("notifications").where("dedupe_key", "like", `${tag}:%`).pluck("id")).map(Number);
    console.log(`queued ${ids.length} notifications (${texts} texts, ${mails} e-mails); draining with ${LOOPS} loops on ${LOOPS} connection pools…`);

    const started = performance.now();
    const pending = async () => Number((await db("notifications").where("dedupe_key", "like", `${tag}:%`).whereIn("state", ["queued", "sending"]).count({ n: "*" }).first())?.n ?? 0);
    const loop = async (pool: Knex) => {
      for (;;) {
        const r = await drainOnce(pool, { limit: 50, concurrency: 16 });
        if (r.claimed === 0) {
          if ((await pending()) === 0) return;
          await new Promise((res) => setTimeout(res, 50));
        }
      }
    };
    await Promise.all(pools.slice(1).map(loop));
    const seconds = (performance.now() - started) / 1000;

    const states = (await db("notifications").where("dedupe_key", "like", `${tag}:%`).groupBy("state").select("state").count({ n: "*" })) as { state: string; n: number }[];
    const byState = Object.fromEntries(states.map((s) => [s.state, Number(s.n)]));
    await new Promise((r) => setTimeout(r, 500));
    const atSms = (await json<{ messages: { body: string }[] }>(`${SMS}/_fake/messages`)).messages.filter((m) => m.body.includes(tag));
    const atMail = (await json<{ messages: { subject: string }[] }>(`${MAILBOX}/api/messages`)).messages.filter((m) => m.subject.includes(tag));
    const distinct = new Set([...atSms.map((m) => m.body), ...atMail.map((m) => m.subject)]).size;
    const received = atSms.length + atMail.length;
    const sent = byState.sent ?? 0;
    console.log(
      [
        `drained ${COUNT} in ${seconds.toFixed(2)} s: ${(sent / seconds).toFixed(0)} messages per second`,
        `sent ${sent}, failed ${byState.failed ?? 0}, still queued ${(byState.queued ?? 0) + (byState.sending ?? 0)}`,
        `received at the fakes: ${atSms.length} texts, ${atMail.length} e-mails; duplicated ${received - distinct}, missing ${COUNT - distinct}`,
      ].join("\n"),
    );
    if (received - distinct > 0 || COUNT - distinct > 0) process.exitCode = 1;
  } finally {
    if (!KEEP) await db("notifications").where("dedupe_key", "like", `${tag}:%`).delete();
    await Promise.all(pools.map((p) => p.destroy()));
    closeEmailTransport();
  }
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
