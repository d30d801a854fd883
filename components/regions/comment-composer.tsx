'use client';

// A comment box with @-completion of the study's members: typing "@" and the start of a name lists the members
// that match; ↑/↓ choose, Enter or Tab (or a click) writes the mention (lib/regions/mentions.ts).
import { useId, useLayoutEffect, useRef, useState } from 'react';
import { mentionText } from '@/lib/regions/mentions';
import { controlClass } from '../fields';

export interface MentionCandidate {
  userId: number;
  name: string;
}

interface CommentComposerProps {
  value: string;
  onChange: (value: string) => void;
  members: readonly MentionCandidate[];
  label: string;
  placeholder?: string;
  rows?: number;
  /** Ctrl/⌘ + Enter. */
  onSubmit?: () => void;
}

/** The "@word" just before the caret, if the caret is in one. */
function mentionQuery(text: string, caret: number): { start: number; query: string } | null {
  const match = /(^|\s)@([^\s@[\]()]{0,40})$/.exec(text.slice(0, caret));
  return match ? { start: caret - match[2].length - 1, query: match[2].toLowerCase() } : null;
}

export function CommentComposer({ value, onChange, members, label, placeholder, rows = 3, onSubmit }: CommentComposerProps) {
  const id = useId();
  const box = useRef<HTMLTextAreaElement>(null);
  const [query, setQuery] = useState<{ start: number; query: string } | null>(null);
  const [active, setActive] = useState(0);
  /** Where the caret goes once a chosen mention is in the box (set before the render that shows it). */
  const caretAfterRender = useRef<number | null>(null);
  // In the same commit as the new text, before the next key is handled: placed later (a frame after), the keys
  // typed meanwhile went where the browser had put the caret, at the end of the text.
  useLayoutEffect(() => {
    if (caretAfterRender.current === null || !box.current) return;
    box.current.setSelectionRange(caretAfterRender.current, caretAfterRender.current);
    caretAfterRender.current = null;
  }, [value]);
  const matches = query ? members.filter((m) => m.name.toLowerCase().includes(query.query)).slice(0, 6) : [];

  const update = (text: string, caret: number) => {
    onChange(text);
    setQuery(mentionQuery(text, caret));
    setActive(0);
  };
  const choose = (member: MentionCandidate) => {
    if (!query || !box.current) return;
    const caret = box.current.selectionStart;
    const inserted = `${mentionText({ id: member.userId, name: member.name })} `;
    const next = value.slice(0, query.start) + inserted + value.slice(caret);
    caretAfterRender.current = query.start + inserted.length;
    onChange(next);
    setQuery(null);
  };

  return (
    <div className="relative space-y-1">
      <label htmlFor={id} className="block text-sm font-medium">
        {label}
      </label>
      <textarea
        id={id}
        ref={box}
        className={`${controlClass} font-mono text-[0.85rem]`}
        rows={rows}
        value={value}
        placeholder={placeholder}
        role="combobox"
        aria-expanded={matches.length > 0}
        aria-controls={`${id}-members`}
        aria-autocomplete="list"
        onChange={(event) => update(event.target.value, event.target.selectionStart)}
        onKeyDown={(event) => {
          if (matches.length > 0) {
            if (event.key === 'ArrowDown' || event.key === 'ArrowUp') {
              event.preventDefault();
              setActive((active + (event.key === 'ArrowDown' ? 1 : matches.length - 1)) % matches.length);
              return;
            }
            if (event.key === 'Enter' || event.key === 'Tab') {
              event.preventDefault();
              choose(matches[active]);
              return;
            }
            if (event.key === 'Escape') {
              setQuery(null);
              return;
            }
          }
          if (event.key === 'Enter' && (event.ctrlKey || event.metaKey)) onSubmit?.();
        }}
      />
      {matches.length > 0 && (
        <ul id={`${id}-members`} role="listbox" aria-label="Members to mention" className="absolute z-10 mt-1 w-64 rounded-md border border-ink/15 bg-paper-raised py-1 shadow-lg">
          {matches.map((member, k) => (
            <li
              key={member.userId}
              role="option"
              aria-selected={k === active}
              className={`cursor-pointer px-3 py-1 text-sm ${k === active ? 'bg-accent-soft' : ''}`}
              onMouseDown={(event) => {
                event.preventDefault();
                choose(member);
              }}
            >
              @{member.name}
            </li>
          ))}
        </ul>
      )}
      <p className="text-xs text-ink-faint">Markdown and $maths$; type @ to mention a member of the study. Ctrl+Enter sends.</p>
    </div>
  );
}
