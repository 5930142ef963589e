import type { Page } from '@playwright/test';

/**
 * Figures of the walk's pipe step (the tree editor), measured in the page: its height, and the
 * longest frame while its list is scrolled from top to bottom. Printed by e2e/tree-editor.spec.ts
 * and written by the bench (e2e/bench/ledger.bench.ts); never asserted against a time.
 */
export async function pageHeight(page: Page): Promise<number> {
  return page.evaluate(() => document.body.scrollHeight);
}

/**
 * Scrolls the tree editor's list (its own scroll box when virtualised, else the window) in steps
 * of one box height per frame to the end, and returns the longest requestAnimationFrame delta and
 * the number of frames.
 */
export async function longestScrollFrame(page: Page): Promise<{ longestMs: number; medianMs: number; frames: number; rowsInPage: number }> {
  return page.evaluate(async () => {
    const box = document.querySelector<HTMLElement>('[data-testid="tree-scroll"]');
    const frame = () => new Promise<number>((r) => requestAnimationFrame((t) => r(t)));
    const max = box ? box.scrollHeight - box.clientHeight : document.documentElement.scrollHeight - window.innerHeight;
    const stepPx = box ? box.clientHeight : window.innerHeight;
    let last = await frame();
    let longest = 0;
    let frames = 0;
    const deltas: number[] = [];
    let rowsInPage = 0;
    for (let y = 0; y <= max + stepPx; y += stepPx) {
      if (box) box.scrollTop = y;
      else window.scrollTo(0, y);
      const t = await frame();
      longest = Math.max(longest, t - last);
      deltas.push(t - last);
      last = t;
      frames++;
      rowsInPage = Math.max(rowsInPage, document.querySelectorAll('[data-testid="tree-editor"] [role="row"][aria-rowindex]').length);
    }
    deltas.sort((a, b) => a - b);
    return { longestMs: longest, medianMs: deltas[Math.floor(deltas.length / 2)] ?? 0, frames, rowsInPage };
  });
}

/**
 * On the building page, with its form filled: clicks "Generate into draft" in the page and returns
 * the time until the generated building's verdict is drawn (the verdict bar says pass or fail
 * beside the "Generated …" note, then one animation frame), and the verdict it shows. Printed by
 * the bench (e2e/bench/ledger.bench.ts); never asserted against a time.
 */
export async function verdictAfterGenerate(page: Page): Promise<{ ms: number; status: string; segments: number }> {
  return page.evaluate(async () => {
    const button = [...document.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Generate into draft');
    if (!button) throw new Error('no "Generate into draft" button');
    const shown = () => {
      const done = document.querySelector('[data-testid="generated"]')?.textContent ?? '';
      const status = document.querySelector('[data-testid="verdict-bar"]')?.getAttribute('data-status') ?? '';
      return /^Generated \d+ segments/.test(done) && (status === 'pass' || status === 'fail')
        ? { status, segments: Number(done.match(/^Generated (\d+)/)![1]) }
        : null;
    };
    const t0 = performance.now();
    const seen = new Promise<{ status: string; segments: number }>((resolve) => {
      const obs = new MutationObserver(() => {
        const s = shown();
        if (s) {
          obs.disconnect();
          resolve(s);
        }
      });
      obs.observe(document.body, { subtree: true, childList: true, attributes: true, characterData: true });
    });
    button.click();
    const s = shown() ?? (await seen);
    await new Promise((r) => requestAnimationFrame(() => r(null)));
    return { ms: performance.now() - t0, ...s };
  });
}
