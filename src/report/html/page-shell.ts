/** What every overask HTML page shares: the document around a body, styles inline, escaping. */

/** Text for HTML content and attribute values. */
export function esc(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** A self-contained page: `css` inline (a `</style` inside it cannot end the element), then `body`. */
export function pageShell(title: string, css: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)}</title>
<style>
${css.replace(/<\/(style)/gi, "<\\/$1")}</style>
</head>
<body>
${body}
</body>
</html>
`;
}
