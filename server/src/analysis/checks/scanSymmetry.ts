/**
 * A note when the point group changes along a scan, or a figure that depends on it (a fragment's
 * counted group, its tapered qubits, the qubits it needs): each point is counted in its own group,
 * so the plan's figures differ from point to point (analysis/scanSymmetry.ts). Information, not a
 * warning: a scan that breaks symmetry is often the point of the scan.
 */
import { formatScanValue, type ScanCoordinate } from '../../chemistry/scan';
import { scanSymmetryOf, type ScanSymmetryRun } from '../scanSymmetry';
import type { EstimateCheckContext } from './context';

/** Runs named in the message at most. */
const NAMED_RUNS = 6;

function runText(run: ScanSymmetryRun, values: readonly number[], coordinate: ScanCoordinate): string {
  const count = run.last - run.first + 1;
  const where = count === 1 ? `at ${formatScanValue(values[run.first]!, coordinate)}` : `from ${formatScanValue(values[run.first]!, coordinate)} to ${formatScanValue(values[run.last]!, coordinate)} (${count} points)`;
  return `${run.symmetry.fullPointGroup ?? 'C1'} ${where}`;
}

/** How each quantum fragment's qubits needed go along the runs, where they change. */
function qubitChanges(runs: readonly ScanSymmetryRun[]): string[] {
  const first = runs[0]!.symmetry.fragments;
  return first.flatMap((fragment, index) => {
    const counts = runs.map((run) => run.symmetry.fragments[index]!);
    if (fragment.qubitsRequired === null || counts.every((point) => point.qubitsRequired === fragment.qubitsRequired)) return [];
    const steps: string[] = [];
    let last: number | null = null;
    for (const point of counts) {
      if (point.qubitsRequired !== last) steps.push(`${point.qubitsRequired} in ${point.pointGroup ?? 'C1'}`);
      last = point.qubitsRequired;
    }
    return [`fragment '${fragment.fragment}' needs ${steps.join(', then ')}`];
  });
}

export function checkScanSymmetry(context: EstimateCheckContext): void {
  const { ast, model, sink, estimates } = context;
  const scan = model.scan;
  if (!ast.scan || !scan) return;
  const symmetry = scanSymmetryOf(estimates);
  if (!symmetry || symmetry.notLookedFor || (!symmetry.groupChanges && !symmetry.figuresChange)) return;
  const runs = symmetry.runs;
  const named = runs.slice(0, NAMED_RUNS).map((run) => runText(run, scan.values, scan.coordinate));
  const more = runs.length > NAMED_RUNS ? `, and ${runs.length - NAMED_RUNS} more runs` : '';
  const qubits = qubitChanges(runs);
  const lead = symmetry.groupChanges ? 'The point group changes along the scan' : 'The groups the fragments are counted in change along the scan';
  sink.report(
    'scan-symmetry-change',
    ast.scan.statement.keyword.span,
    `${lead}: ${named.join('; ')}${more}. Each point is counted in its own group${qubits.length > 0 ? ` (tapering follows it: ${qubits.join('; ')})` : ''}; the scan's hover and report list every point.`,
    { data: { runs: runs.map((run) => ({ first: run.first, last: run.last, group: run.symmetry.fullPointGroup })) } },
  );
}
