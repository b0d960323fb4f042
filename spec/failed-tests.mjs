// Keeps the titles of a mocha run's failed tests so a runner can list them again just above its
// summary line: a log that keeps only its tail (as CI's does) still names them.

/** Collects `runner`'s failures; `list(heading)` returns them as lines under `heading` ('' when none). */
export function failedTests(runner) {
  const failed = [];
  runner.on('fail', (test, err) =>
    failed.push(
      `${test.fullTitle()}: ${String(err?.message ?? err)
        .split('\n')[0]
        .slice(0, 300)}`,
    ),
  );
  return {
    list: (heading) => (failed.length > 0 ? `\n${heading}\n${failed.map((f) => `  - ${f}`).join('\n')}` : ''),
  };
}
