// Next.js calls register() once when a server instance starts.
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { startBackground } = await import("./lib/background");
    startBackground();
  }
}
