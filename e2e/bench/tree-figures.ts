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
