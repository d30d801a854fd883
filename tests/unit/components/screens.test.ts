// Server-rendered markup of the screens the new-user review found wanting: physics labels typeset, Markdown images
// as links that load nothing, a processing panel that agrees with the state badge, a progress bar that shows its
// value at once.
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { MarkdownView } from '@/components/markdown-view';
import { ProcessingPanel } from '@/components/samples/processing-panel';
import { ProvenancePanel } from '@/components/samples/provenance-panel';
import { ProgressBar } from '@/components/samples/progress-bar';
import { Typeset } from '@/components/typeset';
import { axisAscii, axisLabel } from '@/lib/maps/axis-labels';
import { defaultSettings } from '@/lib/ingest/settings';
import type { SampleDetail, SampleProvenance } from '@/lib/samples/shapes';

const html = (element: Parameters<typeof renderToStaticMarkup>[0]) => renderToStaticMarkup(element);

describe('typeset labels', () => {
  it('writes subscripts as subscripts', () => {
    expect(html(createElement(Typeset, { text: 'SoftDrop z_cut' }))).toBe('SoftDrop z<sub>cut</sub>');
    expect(html(createElement(Typeset, { text: 'm_g, z_g and R_g at k_t > 1 GeV' }))).toBe(
      'm<sub>g</sub>, z<sub>g</sub> and R<sub>g</sub> at k<sub>t</sub> &gt; 1 GeV',
    );
    expect(html(createElement(Typeset, { text: 'anti-kt, R = 0.4' }))).toBe('anti-kt, R = 0.4');
  });

  it('labels the plane’s axes with real subscripts and Greek letters, and names e+e− variables (θ, kₜ = E sin θ)', () => {
    const lnKt = { variable: 'lnKt', log: false } as const;
    const lnInvDelta = { variable: 'lnInvDelta', log: false } as const;
    expect(axisLabel(lnKt)).toBe('ln(kₜ/GeV)');
    expect(axisLabel(lnInvDelta)).toBe('ln(1/Δ)');
    expect(axisLabel(lnInvDelta, 'ee')).toBe('ln(1/θ)');
    expect(axisLabel(lnKt, 'ee')).toBe('ln(kₜ/GeV), kₜ = E sin θ');
    expect(axisLabel({ variable: 'delta', log: true }, 'ee')).toBe('ln θ');
    // Files and the API keep ASCII.
    expect(axisAscii(lnInvDelta, 'ee')).toBe('ln(1/theta)');
    expect(axisAscii(lnKt)).toBe('ln(kt/GeV)');
  });
});

describe('Markdown images', () => {
  it('are links to their address, never images', () => {
    const markup = html(createElement(MarkdownView, { source: 'See ![tracking pixel](https://tracker.example/p.png)' }));
    expect(markup).not.toContain('<img');
    expect(markup).toContain('href="https://tracker.example/p.png"');
    expect(markup).toContain('Image: tracking pixel');
  });
});

describe('the processing panel', () => {
  const sample = (state: 'queued' | 'running') => ({ id: 1, state, progress: null }) as unknown as SampleDetail;

  it('says processing has started for a running sample without progress yet', () => {
    const markup = html(createElement(ProcessingPanel, { sample: sample('running') }));
    expect(markup).toContain('Processing');
    expect(markup).not.toContain('Waiting to be processed');
  });

  it('says waiting for a queued sample', () => {
    expect(html(createElement(ProcessingPanel, { sample: sample('queued') }))).toContain('Waiting to be processed');
  });
});

describe('the progress bar', () => {
  it('has the width of its value, with no animation that lags behind the text', () => {
    const markup = html(createElement(ProgressBar, { label: 'Upload progress', fraction: 1 }));
    expect(markup).toContain('width:100%');
    expect(markup).not.toContain('transition');
  });
});

describe('the provenance panel', () => {
  const provenance = (startedAt: string): SampleProvenance => ({
    sample: { id: 3, name: 'Run 12', label: 'r12', state: 'done' },
    study: { id: 1, title: 'Study' },
    file: { name: 'run12.jsonl', size: 1000, sha256: 'ab'.repeat(32) },
    input: null,
    settings: defaultSettings(),
    software: { name: 'splitfield', version: '1.0.0' },
    uploadedBy: null,
    timings: { uploadedAt: '2026-12-02T10:00:05.000Z', uploadSeconds: 5, startedAt, finishedAt: '2026-12-02T10:00:09.000Z', processingSeconds: 8.5 },
    counts: null,
    tree: 'primary',
  });

  it('says how much of the processing went on while the file was arriving, from a tenth of a second on', () => {
    const early = html(createElement(ProvenancePanel, { provenance: provenance('2026-12-02T10:00:00.500Z') }));
    expect(early).toContain('in 8.5 s, 4.5 s of it while the file was arriving');
    const queued = html(createElement(ProvenancePanel, { provenance: provenance('2026-12-02T10:00:06.000Z') }));
    expect(queued).toContain('in 8.5 s');
    expect(queued).not.toContain('arriving');
    const small = html(createElement(ProvenancePanel, { provenance: provenance('2026-12-02T10:00:04.980Z') }));
    expect(small).not.toContain('arriving'); // 0.02 s: less than the times' precision
  });
});
