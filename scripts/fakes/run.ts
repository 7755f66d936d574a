// Starts the local SMS and e-mail fakes and keeps running (scripts/lib/common.sh starts this).
// Ports and credentials from the environment, as scripts/lib/common.sh exports them.
import { startMailFake } from "./mail";
import { startSmsFake } from "./sms";

/** The installation's SMS auth token (scripts/lib/common.sh generates it into .data); no default. */
function requiredToken(token: string | undefined): string {
  if (!token) throw new Error("TWILIO_AUTH_TOKEN is not set; source scripts/lib/common.sh (it generates one into .data/sms-auth-token).");
  return token;
}

async function main() {
  const env = process.env;
  const stamp = () => new Date().toISOString().slice(11, 19);
  const sms = await startSmsFake({
    port: Number(env.SMS_FAKE_PORT ?? 4010),
    accountSid: env.TWILIO_ACCOUNT_SID ?? "AC00000000000000000000000000000000",
    authToken: requiredToken(env.TWILIO_AUTH_TOKEN),
    fromNumber: env.TWILIO_FROM_NUMBER ?? "+13205550199",
    appPublicUrl: env.APP_PUBLIC_URL,
    log: (m) => console.log(`${stamp()} [sms]  ${m}`),
  });
  const mail = await startMailFake({
    smtpPort: Number(env.SMTP_PORT ?? 2525),
    httpPort: Number(env.MAIL_FAKE_HTTP_PORT ?? 4020),
    log: (m) => console.log(`${stamp()} [mail] ${m}`),
  });
  console.log(
    `${stamp()} fakes up: SMS API http://127.0.0.1:${env.SMS_FAKE_PORT ?? 4010}, SMTP 127.0.0.1:${env.SMTP_PORT ?? 2525}, mailbox http://127.0.0.1:${env.MAIL_FAKE_HTTP_PORT ?? 4020}`,
  );
  const stop = async () => {
    await Promise.allSettled([sms.close(), mail.close()]);
    process.exit(0);
  };
  process.on("SIGINT", stop);
  process.on("SIGTERM", stop);
}

main().catch((err) => {
  console.error("the fakes could not start:", err instanceof Error ? err.message : err);
  process.exit(1);
});
