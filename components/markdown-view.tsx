import Markdown, { type Components, defaultUrlTransform } from 'react-markdown';
import rehypeKatex from 'rehype-katex';
import remarkGfm from 'remark-gfm';
import remarkMath from 'remark-math';
import { mentionTarget } from '@/lib/regions/mentions';

// react-markdown builds React elements from the Markdown syntax tree and never injects HTML: raw HTML in the
// source (a <script>, an onclick attribute) stays visible as plain text, and its default URL filter empties
// javascript:, data: and other unsafe link targets; such a link is shown as its plain text. Other links leave
// the app in a new tab without a referrer. Images are never loaded (a remote image tells its server who reads the
// note, and when): each is shown as a link to its address, labelled with its description.
const components: Components = {
  img: ({ src, alt }) =>
    typeof src === 'string' && src ? (
      <a href={src} target="_blank" rel="noopener noreferrer nofollow" className="note-image-link" title={src}>
        Image: {alt || src}
      </a>
    ) : (
      <span title="Image removed: its address is not allowed">Image: {alt}</span>
    ),
  a: ({ href, children }) =>
    href && mentionTarget(href) !== null ? (
      <span className="mention" data-user={mentionTarget(href)!}>
        {children}
      </span>
    ) : href ? (
      <a href={href} target="_blank" rel="noopener noreferrer nofollow">
        {children}
      </a>
    ) : (
      <span title="Link removed: its address is not allowed">{children}</span>
    ),
};

// Maths: $…$ inline and $$…$$ displayed, typeset by KaTeX (its stylesheet and fonts are bundled by app/layout.tsx,
// nothing is fetched). KaTeX runs with its defaults: no \href or \url links, no HTML extensions; a formula it
// cannot read is shown in red as its source text instead of failing the note.
/** A mention (`@[Name](user:12)`, lib/regions/mentions.ts) keeps its address so it can be shown as a mention; every
 * other address goes through react-markdown's own filter. */
function urlTransform(url: string): string {
  return mentionTarget(url) !== null ? url : defaultUrlTransform(url);
}

const katexOptions = { throwOnError: false, strict: 'ignore' as const };

/** A Note's or a comment's Markdown (with tables, task lists, strikethrough, maths and mentions), rendered safely. */
export function MarkdownView({ source }: { source: string }) {
  return (
    <div className="note-body">
      <Markdown remarkPlugins={[remarkGfm, remarkMath]} rehypePlugins={[[rehypeKatex, katexOptions]]} components={components} urlTransform={urlTransform}>
        {source}
      </Markdown>
    </div>
  );
}
