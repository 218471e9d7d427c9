import 'server-only';
import { invalidField } from '@/lib/app-error';
import { hostOf, resolvePublic, WebhookAddressError } from './address-guard';

/**
 * Checks a webhook address before it is saved: http or https, no user name or password in it,
 * and a host whose every address may be reached (address-guard.ts). Throws a 400 naming `url`.
 */
export async function checkWebhookUrl(raw: string): Promise<string> {
  let url: URL;
  try {
    url = new URL(raw);
  } catch {
    throw invalidField('url', 'Enter a full http:// or https:// address.');
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') {
    throw invalidField('url', 'Only http:// and https:// addresses can receive webhooks.');
  }
  if (url.username || url.password) {
    throw invalidField(
      'url',
      'Leave the user name and password out of the address: the receiver checks the signature instead.',
    );
  }
  try {
    await resolvePublic(hostOf(url));
  } catch (error) {
    if (error instanceof WebhookAddressError) throw invalidField('url', error.message);
    throw error;
  }
  url.hash = '';
  return url.toString();
}
