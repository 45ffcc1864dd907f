import type { MailMessage } from './store';

/** Text for HTML content and for double- or single-quoted attribute values. */
export function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/** The sandbox of the iframe that shows a mail's HTML: no scripts, no same origin, links may open. */
export const MAIL_FRAME_SANDBOX = 'allow-popups allow-top-navigation-by-user-activation';

const TITLE = 'Loamline mail fake — local test inbox';

const CSS = `
  :root { --pine: #2F5D50; --pine-dark: #234739; --pine-light: #EEF4F1; --paper: #F7F5F0;
    --ink: #1E2421; --muted: #4D5651; --line: #DDD8CC; --ochre: #C98B2B; }
  * { box-sizing: border-box; }
  body { margin: 0; background: var(--paper); color: var(--ink);
    font: 15px/1.5 system-ui, Helvetica, Arial, sans-serif; }
  header { background: var(--pine); color: #fff; padding: 14px 24px; display: flex; align-items: center;
    gap: 16px; flex-wrap: wrap; }
  header h1 { font-size: 18px; margin: 0; font-weight: 600; }
  header h1 a { color: inherit; text-decoration: none; }
  header p { margin: 0; opacity: .85; font-size: 13px; flex: 1; }
  main { max-width: 1100px; margin: 0 auto; padding: 20px 24px 48px; }
  .bar { display: flex; gap: 12px; align-items: center; flex-wrap: wrap; margin-bottom: 16px; }
  .bar .count { color: var(--muted); flex: 1; }
  .button { display: inline-block; background: var(--pine); color: #fff; border: 0; border-radius: 10px;
    padding: 7px 16px; font: inherit; text-decoration: none; cursor: pointer; }
  .button:hover { background: var(--pine-dark); }
  .button.quiet { background: transparent; color: var(--pine); border: 1px solid var(--pine); }
  input[type=search] { font: inherit; padding: 6px 10px; border: 1px solid var(--line); border-radius: 10px;
    min-width: 240px; background: #fff; }
  table { width: 100%; border-collapse: collapse; background: #fff; border: 1px solid var(--line);
    border-radius: 10px; overflow: hidden; }
  th, td { text-align: left; padding: 9px 12px; border-bottom: 1px solid var(--line); vertical-align: top; }
  th { background: var(--pine-light); font-size: 13px; color: var(--muted); font-weight: 600; }
  tr:last-child td { border-bottom: 0; }
  td.date { white-space: nowrap; color: var(--muted); font-variant-numeric: tabular-nums; }
  a { color: var(--pine); }
  .empty { background: #fff; border: 1px dashed var(--line); border-radius: 10px; padding: 32px;
    text-align: center; color: var(--muted); }
  .card { background: #fff; border: 1px solid var(--line); border-radius: 10px; padding: 16px 20px;
    margin-bottom: 16px; }
  h2 { font-size: 20px; margin: 0 0 12px; overflow-wrap: anywhere; }
  h3 { font-size: 15px; margin: 0 0 8px; color: var(--muted); }
  dl { display: grid; grid-template-columns: max-content 1fr; gap: 4px 16px; margin: 0; }
  dt { color: var(--muted); }
  dd { margin: 0; overflow-wrap: anywhere; }
  iframe { width: 100%; height: 65vh; min-height: 320px; border: 1px solid var(--line); border-radius: 10px;
    background: #fff; }
  pre { white-space: pre-wrap; overflow-wrap: anywhere; margin: 0; font: 14px/1.5 ui-monospace, monospace; }
  ul.links { margin: 0; padding-left: 20px; }
  ul.links li { overflow-wrap: anywhere; }
  code { font: 13px ui-monospace, monospace; }
  details summary { cursor: pointer; color: var(--pine); }
  td { overflow-wrap: anywhere; }
  @media (max-width: 640px) {
    main { padding: 16px 12px 32px; }
    header { padding: 12px; }
    th, td { padding: 8px; }
    td.date { white-space: normal; }
    input[type=search] { min-width: 0; width: 100%; }
    .bar form { display: flex; gap: 8px; flex: 1 1 100%; }
  }
`;

function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<link rel="icon" href="data:,">
<style>${CSS}</style>
</head>
<body>
<header>
  <h1><a href="/">${escapeHtml(TITLE)}</a></h1>
  <p>Mail the app sent on this computer. Nothing here was delivered to anyone.</p>
</header>
<main>
${body}
</main>
</body>
</html>
`;
}

/** `2025-03-01 09:30:00 UTC` */
function shortDate(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 19)} UTC`;
}

function messageHref(id: string): string {
  return `/messages/${encodeURIComponent(id)}`;
}

export function inboxPage(messages: MailMessage[], filter: string, smtpAddress: string): string {
  const refresh = filter ? `/?to=${encodeURIComponent(filter)}` : '/';
  const count = `${messages.length} message${messages.length === 1 ? '' : 's'}${
    filter ? ` to ${escapeHtml(filter)}` : ''
  }`;
  const rows = messages
    .map(
      (m) => `<tr>
  <td class="date">${escapeHtml(shortDate(m.date))}</td>
  <td>${escapeHtml(m.to.join(', '))}</td>
  <td><a href="${escapeHtml(messageHref(m.id))}">${escapeHtml(m.subject || '(no subject)')}</a></td>
</tr>`,
    )
    .join('\n');
  const list =
    messages.length > 0
      ? `<table>
<thead><tr><th>Date</th><th>To</th><th>Subject</th></tr></thead>
<tbody>
${rows}
</tbody>
</table>`
      : `<div class="empty">No messages${filter ? ' for this address' : ' yet'}. Mail sent over SMTP to
<code>${escapeHtml(smtpAddress)}</code> shows up here.</div>`;
  return layout(
    TITLE,
    `<div class="bar">
  <span class="count">${count}</span>
  <form method="get" action="/">
    <input type="search" name="to" placeholder="Filter by recipient" value="${escapeHtml(filter)}" aria-label="Recipient">
    <button class="button quiet" type="submit">Filter</button>
  </form>
  <a class="button" href="${escapeHtml(refresh)}">Refresh</a>
</div>
${list}`,
  );
}

/** Only these links are offered as anchors; anything else (`javascript:` and the like) is shown as text. */
function isSafeLink(link: string): boolean {
  try {
    return ['http:', 'https:', 'mailto:'].includes(new URL(link).protocol);
  } catch {
    return false;
  }
}

/**
 * The mail's HTML for `srcdoc`, with `<base target="_top">` so that a click on a link opens it in
 * the whole tab (the sandbox allows that on a click) instead of inside the frame.
 */
export function frameDocument(html: string): string {
  const base = '<base target="_top">';
  for (const tag of [/<head\b[^>]*>/i, /<html\b[^>]*>/i, /<!doctype[^>]*>/i]) {
    const m = tag.exec(html);
    if (m) return html.slice(0, m.index + m[0].length) + base + html.slice(m.index + m[0].length);
  }
  return base + html;
}

export function messagePage(m: MailMessage): string {
  const rawHref = `/api/messages/${encodeURIComponent(m.id)}/raw`;
  const body =
    m.html !== null
      ? `<iframe title="Message body" sandbox="${MAIL_FRAME_SANDBOX}" referrerpolicy="no-referrer" srcdoc="${escapeHtml(
          frameDocument(m.html),
        )}"></iframe>
${m.text ? `<details><summary>Text version</summary><pre>${escapeHtml(m.text)}</pre></details>` : ''}`
      : `<pre>${escapeHtml(m.text || '(empty body)')}</pre>`;
  const links =
    m.links.length > 0
      ? `<ul class="links">
${m.links
  .map((l) =>
    isSafeLink(l)
      ? `<li><a href="${escapeHtml(l)}" rel="noreferrer">${escapeHtml(l)}</a></li>`
      : `<li><code>${escapeHtml(l)}</code> (not a web link)</li>`,
  )
  .join('\n')}
</ul>`
      : '<p>No links in this message.</p>';
  return layout(
    `${m.subject || '(no subject)'} — ${TITLE}`,
    `<div class="bar">
  <a class="button quiet" href="/">← Inbox</a>
  <span class="count"></span>
  <a class="button quiet" href="${escapeHtml(rawHref)}">Raw source</a>
  <a class="button" href="${escapeHtml(messageHref(m.id))}">Refresh</a>
</div>
<div class="card">
  <h2>${escapeHtml(m.subject || '(no subject)')}</h2>
  <dl>
    <dt>From</dt><dd>${escapeHtml(m.from)}</dd>
    <dt>To</dt><dd>${escapeHtml(m.to.join(', '))}</dd>
    <dt>Subject</dt><dd>${escapeHtml(m.subject)}</dd>
    <dt>Date</dt><dd>${escapeHtml(shortDate(m.date))}</dd>
  </dl>
</div>
<div class="card">
  <h3>Links</h3>
  ${links}
</div>
<div class="card">
  <h3>${m.html !== null ? 'HTML body' : 'Text body'}</h3>
  ${body}
</div>`,
  );
}

export function notFoundPage(what: string): string {
  return layout(
    `Not found — ${TITLE}`,
    `<div class="empty">${escapeHtml(what)}<br><br><a class="button" href="/">Back to the inbox</a></div>`,
  );
}
