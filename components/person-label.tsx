/** A person's name (marked when it is the reader) over their e-mail, both cut short to fit. */
export function PersonLabel({ name, email, isMe, className = '' }: { name: string; email: string; isMe: boolean; className?: string }) {
  return (
    <div className={`min-w-0 ${className}`}>
      <p className="truncate font-medium text-ink" title={name}>
        {name}
        {isMe && <span className="ml-1 font-normal text-ink-faint">(you)</span>}
      </p>
      <p className="truncate text-xs text-ink-soft" title={email}>
        {email}
      </p>
    </div>
  );
}
