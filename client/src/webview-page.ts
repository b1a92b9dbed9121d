// The panels' HTML page: pure text, no editor API, so it can be laid out in a browser by a test.

/**
 * A webview page in the editor's colours under a strict content security policy: nothing remote,
 * inline styles and scripts only with a fresh nonce. `csp` gives the policy for that nonce; `style`
 * is the page's own CSS (after the shared body rule); `body` may use the nonce for its script tag.
 */
export function webviewPage(title: string, csp: (nonce: string) => string, style: string, body: (nonce: string) => string): string {
  const nonce = Array.from({ length: 32 }, () => 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789'.charAt(Math.floor(Math.random() * 62))).join('');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="UTF-8">
<meta http-equiv="Content-Security-Policy" content="${csp(nonce)}">
<meta name="viewport" content="width=device-width, initial-scale=1.0">
<title>${escapeHtml(title)}</title>
<style nonce="${nonce}">
  body { color: var(--vscode-editor-foreground); background: var(--vscode-editor-background); font-family: var(--vscode-font-family); font-size: var(--vscode-font-size); padding: 8px 16px; }
${style}
</style>
</head>
<body>
${body(nonce)}
</body>
</html>`;
}

export function escapeHtml(s: string): string {
  return s.replace(/[<>&"']/g, (c) => `&#${c.charCodeAt(0)};`);
}
