import 'server-only';

import { UTApi, UTFile } from 'uploadthing/server';

import { utapiOptions } from './config';

let utapi: UTApi | null = null;
/** The SDK's server API for the configured upload service (hosted, or the local fake). */
export function uploadApi(): UTApi {
  utapi ??= new UTApi(utapiOptions());
  return utapi;
}

/** Stores bytes received by the server itself (not through the browser) in the upload service. */
export async function storeServerFile(
  bytes: Buffer,
  name: string,
  type: string,
): Promise<{ key: string; url: string }> {
  const [result] = await uploadApi().uploadFiles([
    new UTFile([new Uint8Array(bytes)], name, { type }),
  ]);
  if (!result?.data) {
    throw new Error(`Storing the file failed: ${result?.error?.message ?? 'no answer'}`);
  }
  return { key: result.data.key, url: result.data.ufsUrl };
}

/** Removes stored files; failures are reported, not thrown (the caller is already failing). */
export async function deleteStoredFiles(keys: string[]): Promise<void> {
  try {
    await uploadApi().deleteFiles(keys);
  } catch (error) {
    console.error('[uploads] could not delete stored files', { keys, error: String(error) });
  }
}
