import { after } from 'next/server';
import { z } from 'zod';
import { json, publicRoute } from '@/lib/api/route-handlers';
import { emailSchema } from '@/lib/api/schemas';
import { BODY_LIMITS } from '@/lib/api/body-limits';
import { clientAddress } from '@/lib/api/client-address';
import { readJsonBody } from '@/lib/api/validation';
import { requestPasswordReset } from '@/lib/auth/password-reset';
import { countAttempt, requireNotThrottled, throttleConfig } from '@/lib/auth/throttle';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/**
 * Asks for a reset mail. The answer is the same whether or not an account has the address, and comes as soon:
 * the account is looked up and the mail queued after the answer is sent.
 */
export const POST = publicRoute(async (request) => {
  const address = clientAddress(request, throttleConfig().trustProxy);
  await requireNotThrottled('password reset requests from your address', [['resetAddress', address]]);
  await countAttempt('resetAddress', address);
  const { email } = await readJsonBody(request, z.strictObject({ email: emailSchema }), BODY_LIMITS.account);
  after(() => requestPasswordReset(email).catch((error) => console.error('[mail] password reset request:', error)));
  return json({ message: `If an account has the address ${email}, a mail with a reset link is on its way.` }, 202);
});
