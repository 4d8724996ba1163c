import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { findUserForSignIn } from '../data/users';
import { signInSchema } from '../validations/account';
import { decoyPasswordHash, verifyPassword } from './password';
import { endSession, SESSION_MAX_AGE_SECONDS, startSession } from './sessions';
import { assertSignInAllowed, clearSignInFailures, clientAddress, recordSignInFailure } from './sign-in-limiter';

/**
 * next-auth configuration: e-mail + password sign-in against bcrypt hashes in MariaDB, JWT sessions
 * in an httpOnly, SameSite=Lax cookie. Each sign-in also writes a user_sessions row whose id the JWT
 * carries (`sid`), and sign-out ends that row, so a copy of the cookie stops working with its owner's
 * sign-out (src/lib/auth/sessions.ts). Messages thrown from `authorize` reach the sign-in form.
 */
export const authOptions: NextAuthOptions = {
  secret: process.env.NEXTAUTH_SECRET,
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_SECONDS },
  pages: { signIn: '/signin', error: '/signin' },
  providers: [
    CredentialsProvider({
      id: 'credentials',
      name: 'E-mail and password',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      async authorize(credentials, request) {
        const parsed = signInSchema.safeParse(credentials ?? {});
        if (!parsed.success) throw new Error('Enter your e-mail address and password.');
        const { email, password } = parsed.data;
        const address = clientAddress(request?.headers);

        await assertSignInAllowed(email, address);
        const user = await findUserForSignIn(email);
        const passwordMatches = await verifyPassword(password, user?.passwordHash ?? (await decoyPasswordHash()));
        if (!user || !passwordMatches) {
          await recordSignInFailure(email, address);
          throw new Error('That e-mail address and password do not match an account.');
        }
        if (user.disabled) throw new Error('This account is disabled. Ask your site admin to re-enable it.');
        await clearSignInFailures(email);
        return { id: String(user.id), name: user.name, email: user.email, siteRole: user.siteRole };
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        token.uid = user.id;
        token.siteRole = user.siteRole;
        // `user` is only present at sign-in: this is where a session begins.
        token.sid = await startSession(Number(user.id));
      }
      return token;
    },
    async session({ session, token }) {
      session.user = {
        id: token.uid ?? '',
        name: token.name ?? '',
        email: token.email ?? '',
        siteRole: token.siteRole ?? 'member',
      };
      session.sid = token.sid ?? '';
      return session;
    },
  },
  events: {
    // With JWT sessions next-auth hands over the decoded cookie. A failure here is logged by next-auth
    // and the cookie is still cleared in this browser, but copies of it keep working until the session
    // ends another way (idle limit, password change, account disabled).
    async signOut({ token }) {
      if (typeof token?.sid === 'string' && token.sid !== '') await endSession(token.sid);
    },
  },
};
