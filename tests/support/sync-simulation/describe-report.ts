import type { SimulationReport } from './run-simulation';

/** The report in a few lines, for the soak and for a failing test. */
export function describeReport(report: SimulationReport, problemLines = 20): string {
  const { options: o, fieldConflicts: f, duplicateConflicts: d } = report;
  const lines = [
    `seed ${o.seed}: ${o.devices} devices × ${o.opsPerDevice} ops, ${report.seconds.toFixed(1)} s (${Object.entries(report.phases).map(([k, v]) => `${k} ${v.toFixed(1)}`).join(', ')}); ${report.ops} ops, ${report.records} records, ${report.steps} steps, ${report.syncRounds} sync rounds (${report.failedRounds} failed), ${report.pulledPages} pages pulled`,
    `  faults: ${Object.entries(report.faults).map(([k, v]) => `${v} ${k}`).join(', ')}`,
    `  receipts: ${Object.entries(report.receipts).map(([k, v]) => `${v} ${k}`).join(', ')}`,
    `  field conflicts: ${f.rows} rows (${f.trueRows} true), ${f.clashPairs} clashing pairs (${f.found} found): recall ${(f.recall * 100).toFixed(1)} %, precision ${(f.precision * 100).toFixed(1)} %; duplicate checks: ${d.rows} rows for ${d.groups} sleds (${d.expectedRows} expected)`,
  ];
  if (report.problems.length > 0) {
    lines.push(`  ${report.problems.length} problems:`, ...report.problems.slice(0, problemLines).map((p) => `    - ${p}`));
    if (report.problems.length > problemLines) lines.push(`    ... and ${report.problems.length - problemLines} more`);
  }
  return lines.join('\n');
}
