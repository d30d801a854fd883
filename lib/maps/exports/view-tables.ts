// The export table of each view: a map (density per bin), a contrast (each input's density and each comparison),
// a projection (each sample's projected density and the ratios to the first).
import type { AxisChoice } from '@/lib/physics/plane/axes';
import { axisAscii, densityLabel, TREE_LABELS } from '../axis-labels';
import type { ContrastResult, MapResult, PlaneData, ProjectionResult, SampleRef } from '../shapes';
import type { PlaneView } from '../view-settings';
import type { Dependent, ExportTable, Independent } from './table';

function selectionText(view: PlaneView): string {
  const s = view.selection;
  const parts: string[] = [];
  if (s.ptMin !== null || s.ptMax !== null) parts.push(`${s.ptMin ?? 0} <= pt/GeV${s.ptMax !== null ? ` < ${s.ptMax}` : ''}`);
  if (s.absYMin !== null || s.absYMax !== null) parts.push(`${s.absYMin ?? 0} <= |y|${s.absYMax !== null ? ` < ${s.absYMax}` : ''}`);
  if (s.leading !== null) parts.push(`leading ${s.leading} jet(s) per record`);
  if (s.filter.trim()) parts.push(`filter: ${s.filter.trim()}`);
  return parts.length > 0 ? parts.join('; ') : 'all processed jets';
}

function qualifiers(view: PlaneView, sample: SampleRef) {
  return [
    { name: 'sample', value: `${sample.name} (sha256 ${sample.fileHash})` },
    { name: 'splittings', value: TREE_LABELS[view.tree] },
    { name: 'jet radius R', value: sample.R },
    { name: 'jet selection', value: selectionText(view) },
    { name: 'declustering', value: 'Cambridge/Aachen, harder branch followed' },
  ];
}

/** Bin edges of the 2-D grid, one row per bin in the order density[iy * nx + ix]. */
function gridIndependents(view: PlaneView, plane: PlaneData): Independent[] {
  const nx = plane.xEdges.length - 1;
  const ny = plane.yEdges.length - 1;
  const x: Independent = { name: axisAscii(view.x as AxisChoice), low: [], high: [] };
  const y: Independent = { name: axisAscii(view.y as AxisChoice), low: [], high: [] };
  for (let iy = 0; iy < ny; iy++) {
    for (let ix = 0; ix < nx; ix++) {
      x.low.push(plane.xEdges[ix]);
      x.high.push(plane.xEdges[ix + 1]);
      y.low.push(plane.yEdges[iy]);
      y.high.push(plane.yEdges[iy + 1]);
    }
  }
  return [x, y];
}

function densityColumn(view: PlaneView, sample: SampleRef, plane: PlaneData, name: string): Dependent {
  return {
    name,
    units: densityLabel(view.x as AxisChoice, view.y as AxisChoice, true),
    values: plane.density,
    errors: plane.error,
    qualifiers: qualifiers(view, sample),
  };
}

export function mapTable(result: MapResult): ExportTable {
  const columns: Dependent[] = [densityColumn(result.view, result.sample, result.plane, 'rho')];
  if (result.plane.count) columns.push({ name: 'splittings (raw count)', units: '', values: result.plane.count, errors: null, qualifiers: [] });
  return {
    title: `Per-jet density of ${TREE_LABELS[result.view.tree]}, ${result.sample.name}; ${result.outside.perJet.toPrecision(4)} splittings per jet lie outside these bins`,
    independent: gridIndependents(result.view, result.plane),
    dependent: columns,
  };
}

export function contrastTable(result: ContrastResult): ExportTable {
  const byId = new Map(result.inputs.map((input) => [input.sample.id, input.sample]));
  const columns: Dependent[] = result.inputs.map((input, k) => densityColumn(result.view, input.sample, input.plane, `rho ${String.fromCharCode(65 + k)}`));
  result.comparisons.forEach((comparison, k) => {
    const b = String.fromCharCode(66 + k);
    const name = comparison.mode === 'ratio' ? `rho ${b} / rho A` : comparison.mode === 'difference' ? `rho ${b} - rho A` : `pull (rho ${b} - rho A) / sigma`;
    columns.push({
      name,
      units: comparison.mode === 'difference' ? densityLabel(result.view.x as AxisChoice, result.view.y as AxisChoice, true) : '',
      values: comparison.value,
      errors: comparison.mode === 'pull' ? null : comparison.error,
      qualifiers: [
        { name: 'A', value: byId.get(comparison.reference)?.name ?? String(comparison.reference) },
        { name: b, value: byId.get(comparison.sample)?.name ?? String(comparison.sample) },
        { name: 'masked', value: `bins with fewer than ${result.minEntries} splittings in either sample` },
        { name: 'chi2/ndf', value: `${comparison.chi2.toPrecision(6)}/${comparison.ndf}` },
      ],
    });
  });
  return { title: `Contrast (${result.mode}) of ${result.inputs.map((i) => i.sample.name).join(', ')}`, independent: gridIndependents(result.view, result.inputs[0].plane), dependent: columns };
}

export function projectionTable(result: ProjectionResult): ExportTable {
  const onto = (result.onto === 'x' ? result.view.x : result.view.y) as AxisChoice;
  const other = (result.onto === 'x' ? result.view.y : result.view.x) as AxisChoice;
  const slice = `${result.slice.from} <= ${axisAscii(other)} < ${result.slice.to}`;
  const columns: Dependent[] = result.series.map((series, k) => ({
    name: `rho ${String.fromCharCode(65 + k)}`,
    units: `splittings per jet per unit ${axisAscii(onto)}`,
    values: series.density,
    errors: series.error,
    qualifiers: [...qualifiers(result.view, series.sample), { name: 'slice', value: slice }],
  }));
  result.ratios.forEach((ratio, k) => {
    columns.push({ name: `rho ${String.fromCharCode(66 + k)} / rho A`, units: '', values: ratio.value, errors: ratio.error, qualifiers: [{ name: 'slice', value: slice }] });
  });
  return {
    title: `Projection onto ${axisAscii(onto)} in ${slice}`,
    independent: [{ name: axisAscii(onto), low: result.edges.slice(0, -1), high: result.edges.slice(1) }],
    dependent: columns,
  };
}
