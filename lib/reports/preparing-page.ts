/**
 * The page answered (202) while a certificate is being built: it says so and reloads itself every
 * few seconds until the PDF is ready.
 */
export function certificatePreparingPage(input: { title: string; refreshSeconds: number }): string {
  const escape = (text: string) =>
    text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="refresh" content="${input.refreshSeconds}">
<title>Preparing ${escape(input.title)}</title>
<style>
body { font-family: system-ui, sans-serif; color: #18202c; background: #f6f8fa; margin: 0; }
main { max-width: 36rem; margin: 4rem auto; padding: 1.5rem; background: #fff; border-radius: 0.5rem; }
h1 { font-size: 1.25rem; margin: 0 0 0.75rem; }
p { line-height: 1.5; }
</style>
</head>
<body>
<main>
<h1>The certificate is being prepared</h1>
<p>${escape(input.title)} is being built from the batch's current results. This page reloads every ${input.refreshSeconds} seconds and opens the PDF when it is ready.</p>
<p>Once built, the same certificate is handed out again until the batch's data changes.</p>
</main>
</body>
</html>`;
}
