'use client';

import { useId, useState, type DragEvent } from 'react';
import { formatBytes } from './numbers';

interface FileDropProps {
  file: File | null;
  onFile: (file: File) => void;
  disabled?: boolean;
  /** What is wrong with the file (or its absence): shown in the zone, the picker marked invalid. */
  error?: string;
}

/** A zone that takes a dropped file, with a file picker inside it for those who prefer to browse. */
export function FileDrop({ file, onFile, disabled, error }: FileDropProps) {
  const inputId = useId();
  const [over, setOver] = useState(false);

  function take(event: DragEvent) {
    event.preventDefault();
    setOver(false);
    const dropped = event.dataTransfer.files[0];
    if (dropped && !disabled) onFile(dropped);
  }

  return (
    <div
      onDragOver={(event) => {
        event.preventDefault();
        if (!disabled) setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={take}
      className={`rounded-lg border-2 border-dashed px-4 py-8 text-center transition-colors ${
        over ? 'border-accent bg-accent-soft/50' : error ? 'border-danger/60 bg-paper-raised' : 'border-ink/20 bg-paper-raised'
      }`}
    >
      {file ? (
        <p className="text-sm text-ink">
          <span className="font-medium break-all">{file.name}</span>
          <span className="text-ink-soft"> · {formatBytes(file.size)}</span>
        </p>
      ) : (
        <p className="text-sm text-ink-soft">Drop a particle file here</p>
      )}
      <label
        htmlFor={inputId}
        className={`mt-3 inline-flex h-9 cursor-pointer items-center rounded-md border border-ink/15 bg-paper-raised px-3 text-sm font-medium text-ink hover:border-ink/30 hover:bg-paper-sunk ${
          disabled ? 'pointer-events-none opacity-50' : ''
        }`}
      >
        {file ? 'Choose another file' : 'Choose a file'}
      </label>
      <input
        id={inputId}
        type="file"
        aria-label="Particle file"
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${inputId}-error` : undefined}
        accept=".jsonl,.json,.gz,.hepmc,.hepmc3,.txt,.parquet,.arrow,.arrows,.feather,.ipc"
        className="sr-only"
        disabled={disabled}
        onChange={(event) => {
          const chosen = event.target.files?.[0];
          if (chosen) onFile(chosen);
        }}
      />
      {error && (
        <p id={`${inputId}-error`} className="mt-3 text-xs font-medium text-danger">
          {error}
        </p>
      )}
      <p className="mt-3 text-xs text-ink-faint">
        splitfield-particles (JSON Lines or one JSON document) or HepMC3 text, optionally gzip-compressed, or a Parquet or
        Arrow file in Splitfield&apos;s columnar schema.
      </p>
    </div>
  );
}
