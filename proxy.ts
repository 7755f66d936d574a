import { withAuth } from "next-auth/middleware";

// Signed-out visitors are sent to /login for every page of the app. API routes check the
// session and role themselves (and answer 401/403 as JSON), so they are not matched here; nor
// are the service worker, the web manifest and the offline page (issue 20), which are public.
export default withAuth({
  pages: { signIn: "/login" },
  callbacks: { authorized: ({ token }) => !!token },
});

export const config = {
  matcher: ["/((?!api|login|reset-password|_next|favicon.ico|icons/|fonts|forbidden|sw\\.js|manifest\\.webmanifest|offline).*)"],
};
