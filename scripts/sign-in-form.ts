/**
 * Signs in through the sign-in page's own form, as a browser without JavaScript would: the
 * server action's hidden fields from the page, plus e-mail and password, posted as multipart
 * form data. Used by bench:load and by end-to-end tests that speak plain HTTP.
 */

function decodeEntities(text: string): string {
  return text
    .replace(/&quot;/g, '"')
    .replace(/&#x27;|&#39;/g, "'")
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');
}

export type SignInFormAnswer = {
  status: number;
  /** `beadline_session=…` when the sign-in succeeded. */
  cookie: string | null;
  /** The page sent back when it did not (the form with its message). */
  html: string;
};

export async function postSignInForm(
  origin: string,
  credentials: { email: string; password: string },
  headers: Record<string, string> = {},
): Promise<SignInFormAnswer> {
  const page = await fetch(`${origin}/sign-in`, { headers });
  if (!page.ok) throw new Error(`GET /sign-in answered ${page.status}; is Beadline running at ${origin}?`);
  const form = /<form[^>]*>([\s\S]*?)<\/form>/.exec(await page.text())?.[1];
  if (!form) throw new Error('The sign-in page has no form.');
  const body = new FormData();
  for (const input of form.matchAll(/<input([^>]*)>/g)) {
    const attributes = input[1]!;
    if (!/type="hidden"/.test(attributes)) continue;
    const name = /name="([^"]*)"/.exec(attributes)?.[1];
    if (!name) continue;
    body.append(decodeEntities(name), decodeEntities(/value="([^"]*)"/.exec(attributes)?.[1] ?? ''));
  }
  body.append('email', credentials.email);
  body.append('password', credentials.password);
  const answer = await fetch(`${origin}/sign-in`, {
    method: 'POST',
    body,
    headers: { ...headers, origin },
    redirect: 'manual',
  });
  const cookie =
    answer.headers
      .getSetCookie()
      .map((c) => c.split(';')[0]!)
      .find((c) => c.startsWith('beadline_session=') && c.length > 'beadline_session='.length) ?? null;
  return { status: answer.status, cookie, html: await answer.text() };
}
