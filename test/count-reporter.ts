// A few-line reporter: failures in full, then one plain closing line that CI counts.
import type { Reporter, TestModule } from 'vitest/node';

export default class CountReporter implements Reporter {
  onTestRunEnd(modules: ReadonlyArray<TestModule>, errors: ReadonlyArray<unknown>): void {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const mod of modules) {
      for (const test of mod.children.allTests()) {
        const state = test.result().state;
        if (state === 'passed') passed++;
        else if (state === 'failed') {
          failed++;
          const err = test.result().errors?.[0];
          console.log(`FAIL ${mod.moduleId.replace(process.cwd() + '/', '')} > ${test.fullName}`);
          if (err) console.log(`     ${String(err.message).split('\n').slice(0, 8).join('\n     ')}`);
        } else skipped++;
      }
      for (const err of mod.errors()) {
        failed++;
        console.log(`FAIL ${mod.moduleId.replace(process.cwd() + '/', '')}: ${String(err.message).split('\n')[0]}`);
      }
    }
    for (const err of errors) {
      failed++;
      console.log(`ERROR ${String((err as Error)?.message ?? err).split('\n')[0]}`);
    }
    console.log(`${passed} passed, ${failed} failed` + (skipped ? `, ${skipped} skipped` : ''));
  }
}
