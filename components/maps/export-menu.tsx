'use client';

import { useState } from 'react';
import type { ExportFormat } from '@/lib/maps/queries';
import { Button, buttonClass } from '../button';
import { downloadPng, downloadSvg } from '../plane/figure-export';

interface ExportMenuProps {
  /** The API address of the view's data in an export format. */
  url: (format: ExportFormat) => string;
  /** The drawn figure, for SVG and PNG. */
  figure: () => Element | null;
  title: string;
  /** File name without extension. */
  baseName: string;
}

const TABLES: Array<[ExportFormat, string]> = [
  ['csv', 'CSV'],
  ['json', 'JSON'],
  ['yaml', 'YAML table'],
  ['provenance', 'Provenance'],
];

/** Downloads of a view: the figure (SVG, PNG) and its binned values with errors and provenance. */
export function ExportMenu({ url, figure, title, baseName }: ExportMenuProps) {
  const [problem, setProblem] = useState<string | null>(null);
  const withFigure = async (save: (element: Element) => void | Promise<void>) => {
    const element = figure();
    if (!element) return;
    try {
      await save(element);
      setProblem(null);
    } catch (error) {
      setProblem((error as Error).message);
    }
  };
  return (
    <div role="group" aria-label="Downloads" className="flex flex-wrap items-center gap-1.5 text-sm">
      <span className="mr-1 text-ink-soft">Download</span>
      <Button size="sm" onClick={() => withFigure((element) => downloadSvg(element, title, `${baseName}.svg`))}>
        SVG
      </Button>
      <Button size="sm" onClick={() => withFigure((element) => downloadPng(element, title, `${baseName}.png`))}>
        PNG
      </Button>
      {TABLES.map(([format, label]) => (
        <a key={format} href={url(format)} download className={buttonClass('secondary', 'sm')}>
          {label}
        </a>
      ))}
      {problem && <span className="text-xs text-danger">{problem}</span>}
    </div>
  );
}
