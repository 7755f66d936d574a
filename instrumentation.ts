// Next.js calls register() once when a server instance starts.
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    // The TCP peer's address on every request, for the sign-in limit (lib/auth/client-address.ts).
    const { installPeerStamp } = await import("./lib/auth/client-address");
    installPeerStamp();
    const { startBackground } = await import("./lib/jobs/background");
    startBackground();
  }
}
