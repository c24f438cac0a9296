/**
 * The page served (status 503) while the database is down: self-contained, since nothing that
 * needs the database can render. It reloads itself, so it turns back into the page people asked
 * for once the database answers.
 */
export function unavailablePage(): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="refresh" content="10">
<title>Sortie is catching its breath</title>
<style>
  body { margin: 0; padding: 0 1rem; font-family: system-ui, sans-serif; background: #f5f3ec; color: #14212b; }
  main { max-width: 34rem; margin: 12vh auto; padding: 2rem; background: #fffdf8; border: 1px solid #d9d4c7; border-radius: 0.75rem; }
  h1 { font-size: 1.35rem; margin: 0 0 0.75rem; }
  p { color: #46555f; line-height: 1.5; }
  a { color: #0d5c63; }
</style>
</head>
<body>
<main role="alert">
  <h1>Sortie cannot reach its database right now</h1>
  <p>Nothing is lost: every log you have uploaded stays in storage, and runs that were being read are picked up again when the database is back.</p>
  <p>This page tries again by itself every 10 seconds. You can also <a href="">reload now</a>.</p>
  <p>If it lasts, tell whoever runs your Sortie server: the database did not answer.</p>
</main>
</body>
</html>`;
}
