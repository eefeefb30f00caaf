// Pages of the local identity provider, in Coppice's look (moss, sand, slate; Work Sans).

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} · Coppice sign-in</title>
<style>
@font-face{font-family:'Work Sans';font-weight:400;src:url('/idp-assets/work-sans-latin-400-normal.woff2') format('woff2')}
@font-face{font-family:'Work Sans';font-weight:600;src:url('/idp-assets/work-sans-latin-600-normal.woff2') format('woff2')}
body{margin:0;min-height:100vh;display:grid;place-items:center;background:#f3ecdf;color:#2f3a40;font-family:'Work Sans',system-ui,sans-serif}
main{width:min(24rem,92vw);background:#fffdf8;border:1px solid #d9ccb4;border-top:6px solid #2f5d46;border-radius:10px;padding:2rem;box-shadow:0 8px 24px rgba(47,58,64,.08)}
h1{font-size:1.35rem;margin:0 0 .25rem;color:#2f5d46}
p{margin:.25rem 0 1rem;line-height:1.45}
label{display:block;font-weight:600;margin:.9rem 0 .3rem}
input{box-sizing:border-box;width:100%;padding:.6rem .7rem;border:1px solid #9aa5ab;border-radius:6px;font:inherit}
input:focus{outline:3px solid #8fb59c;outline-offset:1px}
button{margin-top:1.3rem;width:100%;padding:.7rem;border:0;border-radius:6px;background:#2f5d46;color:#fff;font:inherit;font-weight:600;cursor:pointer}
button:focus{outline:3px solid #c98a2e;outline-offset:2px}
.error{background:#fbe7e2;border-left:4px solid #b5472f;padding:.6rem .8rem;border-radius:4px}
.note{font-size:.85rem;color:#56646b}
</style></head><body><main>${body}</main></body></html>`;
}

export function loginPage(input: {
  action: string;
  email: string;
  error?: string;
  disabled?: boolean;
}): string {
  const error = input.error ? `<p class="error" role="alert">${input.error}</p>` : '';
  if (input.disabled) return page('Sign-in', `<h1>Coppice sign-in</h1>${error}`);
  return page(
    'Sign in',
    `<h1>Sign in to Coppice</h1>
<p class="note">Local sign-in service for development and the invented Quillfern demo.</p>
${error}
<form method="post" action="${escapeHtml(input.action)}" autocomplete="on">
<label for="username">Work e-mail</label>
<input id="username" name="username" type="email" required autofocus value="${escapeHtml(input.email)}">
<label for="password">Password</label>
<input id="password" name="password" type="password" required>
<button type="submit">Sign in</button>
</form>`,
  );
}

export function confirmSignOutPage(providerForm: string): string {
  // The app asked for the sign-out already; the provider still wants its own form confirmed.
  const form = providerForm
    .replace('<form ', '<form id="confirm-sign-out" ')
    .replace(
      '</form>',
      '<input type="hidden" name="logout" value="yes"><button type="submit">Finish signing out</button></form>',
    );
  return page(
    'Signing out',
    `<h1>Signing out</h1><p>You have left Coppice. Confirm to end the sign-in session too.</p>${form}`,
  );
}

export function signedOutPage(): string {
  return page('Signed out', '<h1>Signed out</h1><p>You are signed out of Coppice.</p>');
}
