import { withAuth } from "next-auth/middleware";

/**
 * Redirects anonymous visitors of app pages to /login. Only a redirect: every route handler and page checks the
 * session and role itself on the server. API routes answer 401/403 JSON on their own and are not matched here.
 */
export default withAuth({ pages: { signIn: "/login" } });

export const config = {
  matcher: ["/((?!api|login|set-password|forgot-password|_next|favicon.ico|robots.txt|fonts).*)"],
};
