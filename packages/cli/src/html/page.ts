import { reportClient } from "./client.js";
import { escapeHtml } from "./markup.js";
import { pageStyle } from "./style.js";

/**
 * A whole HTML document: its style sheet and script inline, nothing fetched (a restrictive
 * content policy says so to the browser as well), so one file carries the whole report.
 */
export function htmlPage(title: string, body: string): string {
  const script = `(${reportClient.toString()})();`;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; script-src 'unsafe-inline'; img-src data:">
<meta name="generator" content="onset">
<title>${escapeHtml(title)}</title>
<style>${pageStyle()}</style>
</head>
<body>
${body}
<script>${script}</script>
</body>
</html>
`;
}
