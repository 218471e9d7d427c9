/** Where the product is served; used for cookies, Origin checks and links in e-mails. */
export function appUrl(): string {
  const fromEnv = process.env.APP_URL;
  if (fromEnv) return fromEnv.replace(/\/+$/, '');
  return `http://127.0.0.1:${process.env.PORT ?? '3000'}`;
}
