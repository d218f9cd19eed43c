/**
 * The map attribution typed in Settings is user text. Leaflet inserts attribution as HTML, so it
 * is handed over only as markup built here: the text escaped, and `<a href="http(s)://…">label</a>`
 * links (the form tile servers publish their credits in) rebuilt as plain links. Anything else
 * (an image, a script, an event attribute, a javascript: link) shows as the characters typed.
 */
const LINK = /<a\s+href\s*=\s*"(https?:\/\/[^"<>\s]+)"\s*>([^<]*)<\/a>/gi;

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (ch) => `&#${ch.charCodeAt(0)};`);
}

export function attributionHtml(text: string): string {
  let out = '';
  let last = 0;
  for (const m of text.matchAll(LINK)) {
    out += escapeHtml(text.slice(last, m.index));
    out += `<a href="${escapeHtml(m[1])}" rel="noopener noreferrer" target="_blank">${escapeHtml(decodeEntities(m[2]))}</a>`;
    last = m.index! + m[0].length;
  }
  return out + escapeHtml(text.slice(last));
}

/** The few entities a published credit uses (© as &copy;); the result is escaped again. */
function decodeEntities(s: string): string {
  return s.replace(/&copy;/g, '©').replace(/&amp;/g, '&');
}
