import 'server-only';
import { lookup, type LookupAddress } from 'node:dns';
import { refusedAddressReason } from '@/lib/webhooks/addresses';

/**
 * Server-side request forgery guard for webhooks: a webhook host must resolve to public
 * addresses only, every one of them, checked when the webhook is registered and again when each
 * delivery connects (the connection uses the addresses just checked, so a name that changes its
 * answer after registration — DNS rebinding — cannot reach an internal address).
 * WEBHOOK_ALLOW_PRIVATE=1 lifts the check, for a receiver on this machine or the lab's own
 * network (tests and development set it).
 */
export function privateAddressesAllowed(): boolean {
  return process.env.WEBHOOK_ALLOW_PRIVATE === '1';
}

export const ALLOW_PRIVATE_ADVICE =
  'Webhooks are sent to public internet addresses only. To send them to a receiver on this machine or your own network (for testing), start Beadline with WEBHOOK_ALLOW_PRIVATE=1.';

export class WebhookAddressError extends Error {
  constructor(
    message: string,
    readonly kind: 'unresolved' | 'refused',
  ) {
    super(message);
  }
}

/** The host of a URL as DNS takes it (IPv6 literals without their brackets). */
export function hostOf(url: URL): string {
  return url.hostname.replace(/^\[(.*)\]$/, '$1');
}

function lookupAll(hostname: string): Promise<LookupAddress[]> {
  return new Promise((resolve, reject) =>
    lookup(hostname, { all: true, verbatim: true }, (error, addresses) =>
      error ? reject(error) : resolve(addresses),
    ),
  );
}

/** Resolves `hostname` and checks every address; throws WebhookAddressError saying why not. */
export async function resolvePublic(hostname: string): Promise<LookupAddress[]> {
  let addresses: LookupAddress[];
  try {
    addresses = await lookupAll(hostname);
  } catch {
    throw new WebhookAddressError(
      `The host “${hostname}” could not be found. Check the address.`,
      'unresolved',
    );
  }
  if (addresses.length === 0) {
    throw new WebhookAddressError(`The host “${hostname}” has no address.`, 'unresolved');
  }
  if (privateAddressesAllowed()) return addresses;
  for (const { address } of addresses) {
    const reason = refusedAddressReason(address);
    if (reason) {
      throw new WebhookAddressError(
        `The host “${hostname}” resolves to ${reason}. ${ALLOW_PRIVATE_ADVICE}`,
        'refused',
      );
    }
  }
  return addresses;
}

type LookupCallback = (
  error: NodeJS.ErrnoException | null,
  address: string | LookupAddress[],
  family?: number,
) => void;

/**
 * A `lookup` for node:http(s) that answers only checked addresses, so the connection goes to an
 * address that was checked in the same step.
 */
export function checkedLookup(
  hostname: string,
  options: { all?: boolean } | number | undefined,
  callback: LookupCallback,
): void {
  resolvePublic(hostname).then(
    (addresses) => {
      if (typeof options === 'object' && options?.all) callback(null, addresses);
      else callback(null, addresses[0]!.address, addresses[0]!.family);
    },
    (error: Error) => callback(Object.assign(error, { code: 'EWEBHOOKADDRESS' }), ''),
  );
}
