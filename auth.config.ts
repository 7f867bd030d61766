import Credentials from '@auth/core/providers/credentials';
import { defineConfig } from 'auth-astro';
import { verifyCredentials } from './src/lib/server/auth/credentials';
import { endSession, sessionIsOpen, SESSION_MAX_AGE_S } from './src/lib/server/auth/sessions';
import { forgetActors } from './src/lib/server/actors';
import { getDb } from './src/lib/server/db';

// The secret is read at run time (scripts/start.mjs generates one into the data directory
// on first start), not baked into the build.
export default defineConfig({
  secret: process.env.AUTH_SECRET,
  trustHost: true,
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_S },
  // A wrong password is an everyday event, not a server error: keep it out of the error log.
  logger: {
    error(error) {
      const kind = (error as { type?: string }).type ?? error.name;
      if (kind === 'CredentialsSignin') return;
      console.error(`[auth] ${kind}: ${error.message}`);
    },
  },
  pages: { signIn: '/signin', error: '/signin' },
  providers: [
    Credentials({
      credentials: { email: { label: 'E-mail' }, password: { label: 'Password', type: 'password' } },
      authorize: (credentials) => verifyCredentials(credentials),
    }),
  ],
  events: {
    // Sign-out ends the session row, so the old cookie is refused by every server process.
    async signOut(message) {
      const sid = 'token' in message ? message.token?.sid : undefined;
      if (typeof sid !== 'string') return;
      await endSession(await getDb(), sid);
      forgetActors();
    },
  },
  callbacks: {
    async jwt({ token, user }) {
      if (user?.id) {
        token.uid = user.id;
        token.role = (user as { role?: string }).role;
        // The session row opened at sign-in (auth/sessions.ts); the middleware checks it.
        token.sid = (user as { sid?: string }).sid;
        return token;
      }
      // Auth.js's own session endpoint: an ended session answers as signed out (and the
      // cookie is cleared), as our middleware does for every other route.
      if (typeof token.sid !== 'string' || !(await sessionIsOpen(await getDb(), token.sid))) return null;
      return token;
    },
    session({ session, token }) {
      if (session.user && typeof token.uid === 'string') {
        session.user.id = token.uid;
        (session.user as { role?: unknown }).role = token.role;
      }
      return session;
    },
  },
});
