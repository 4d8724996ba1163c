import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { findUserForSignIn } from '../data/users';
import { signInSchema } from '../validations/account';
import { decoyPasswordHash, verifyPassword } from './password';
import { assertSignInAllowed, clearSignInFailures, recordSignInFailure } from './sign-in-limiter';

/** How long a session lasts without activity: one working day. */
const SESSION_MAX_AGE_SECONDS = 8 * 60 * 60;

/**
 * The client address for rate limiting, known only behind a reverse proxy that sets X-Forwarded-For.
 * Without one every request would share one key, and a few bad guesses could lock everyone out.
 */
function clientAddress(headers: Record<string, unknown> | undefined): string | null {
  const forwarded = headers?.['x-forwarded-for'];
  if (typeof forwarded === 'string' && forwarded.length > 0) return forwarded.split(',')[0].trim();
  return null;
}

/**
 * next-auth configuration: e-mail + password sign-in against bcrypt hashes in MariaDB, JWT sessions
 * in an httpOnly, SameSite=Lax cookie. Messages thrown from `authorize` reach the sign-in form.
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
        return { id: String(user.id), name: user.name, email: user.email, siteRole: user.siteRole, sessionVersion: user.sessionVersion };
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        token.uid = user.id;
        token.siteRole = user.siteRole;
        token.sessionVersion = user.sessionVersion;
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
      session.sessionVersion = token.sessionVersion ?? 0;
      return session;
    },
  },
};
