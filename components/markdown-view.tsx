import Markdown, { type Components } from 'react-markdown';
import remarkGfm from 'remark-gfm';

// react-markdown builds React elements from the Markdown syntax tree and never injects HTML: raw HTML in the
// source (a <script>, an onclick attribute) stays visible as plain text, and its default URL filter drops
// javascript:, data: and other unsafe link targets. Links leave the app in a new tab without a referrer.
const components: Components = {
  a: ({ href, children }) => (
    <a href={href} target="_blank" rel="noopener noreferrer nofollow">
      {children}
    </a>
  ),
};

/** A Note's Markdown (with tables, task lists and strikethrough), rendered safely. */
export function MarkdownView({ source }: { source: string }) {
  return (
    <div className="note-body">
      <Markdown remarkPlugins={[remarkGfm]} components={components}>
        {source}
      </Markdown>
    </div>
  );
}
