// The HTML part of a received mail, made safe to show inside the Outbox page: an allow-list of plain formatting
// elements with no attributes except a link's href (http, https or mailto only); scripts, styles, frames, forms
// and their content are dropped, other unknown elements are replaced by their content.
import { parseHTML } from 'linkedom';

const KEPT = new Set([
  'a', 'b', 'blockquote', 'br', 'code', 'div', 'em', 'h1', 'h2', 'h3', 'h4', 'hr', 'i', 'li', 'ol', 'p', 'pre',
  'small', 'span', 'strong', 'table', 'tbody', 'td', 'th', 'thead', 'tr', 'u', 'ul',
]);
const DROPPED_WITH_CONTENT = new Set(['script', 'style', 'iframe', 'object', 'embed', 'form', 'template', 'head', 'title', 'svg', 'math', 'noscript']);
const SAFE_LINK = /^(https?:|mailto:)/i;

interface HtmlNode {
  nodeType: number;
  nodeName: string;
  childNodes: ArrayLike<HtmlNode>;
  textContent: string | null;
  getAttribute?(name: string): string | null;
}

function escapeText(text: string): string {
  return text.replace(/[&<>]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;' })[c]!);
}

function serialise(node: HtmlNode): string {
  if (node.nodeType === 3) return escapeText(node.textContent ?? '');
  if (node.nodeType !== 1 && node.nodeType !== 9 && node.nodeType !== 11) return '';
  const name = node.nodeName.toLowerCase();
  if (DROPPED_WITH_CONTENT.has(name)) return '';
  const inner = Array.from(node.childNodes).map(serialise).join('');
  if (!KEPT.has(name)) return inner;
  if (name === 'br' || name === 'hr') return `<${name}>`;
  if (name === 'a') {
    const href = (node.getAttribute?.('href') ?? '').trim();
    if (!SAFE_LINK.test(href)) return inner;
    return `<a href="${escapeText(href).replace(/"/g, '&quot;')}" rel="noopener noreferrer">${inner}</a>`;
  }
  return `<${name}>${inner}</${name}>`;
}

export function sanitizeMailHtml(html: string): string {
  const { document } = parseHTML(`<!doctype html><html><body>${html}</body></html>`);
  return Array.from((document.body as unknown as HtmlNode).childNodes).map(serialise).join("");
}
