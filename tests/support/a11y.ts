import axe from 'axe-core';
import type { Page } from 'playwright-core';

/** The impacts that fail a page: everything axe-core reports except "minor". */
export const FAILING_IMPACTS = ['critical', 'serious', 'moderate'] as const;

export type AxeProblem = { rule: string; impact: string; nodes: number; help: string; targets: string[] };

/**
 * Runs axe-core (the registry's package, injected into the page) over the whole document and
 * returns every critical, serious or moderate violation, with up to five offending elements each.
 * The browser context must be made with `bypassCSP: true`: the app's policy refuses inline scripts.
 */
export async function axeProblems(page: Page): Promise<AxeProblem[]> {
  const loaded = await page.evaluate(() => typeof (window as unknown as { axe?: unknown }).axe === 'object');
  if (!loaded) await page.addScriptTag({ content: axe.source });
  const results = await page.evaluate(async () => {
    const run = (window as unknown as { axe: typeof axe }).axe;
    const r = await run.run(document, { resultTypes: ['violations'] });
    return r.violations.map((v) => ({ rule: v.id, impact: v.impact ?? 'unknown', help: v.help, nodes: v.nodes.length, targets: v.nodes.slice(0, 5).map((n) => n.target.join(' ')) }));
  });
  return results.filter((v) => (FAILING_IMPACTS as readonly string[]).includes(v.impact));
}

export type LayoutProblem = { kind: 'beyond-the-window' | 'clipped-text'; what: string; detail: string };

/**
 * What a reader cannot see whole: elements that reach past the right edge of the window outside
 * anything that scrolls sideways, and text cut short (an ellipsis, or lines hidden) by its box.
 */
export async function layoutProblems(page: Page): Promise<LayoutProblem[]> {
  return page.evaluate(() => {
    const problems: { kind: 'beyond-the-window' | 'clipped-text'; what: string; detail: string }[] = [];
    const width = document.documentElement.clientWidth;
    const describe = (el: Element) => {
      const text = (el.textContent ?? '').replace(/\s+/g, ' ').trim().slice(0, 60);
      return `${el.tagName.toLowerCase()}${el.getAttribute('role') ? `[role=${el.getAttribute('role')}]` : ''} “${text}”`;
    };
    const scrollsSideways = (el: Element): boolean => {
      for (let p = el.parentElement; p; p = p.parentElement) {
        const s = getComputedStyle(p);
        if ((s.overflowX === 'auto' || s.overflowX === 'scroll') && p.scrollWidth > p.clientWidth) return true;
      }
      return false;
    };
    for (const el of Array.from(document.body.querySelectorAll('*'))) {
      const style = getComputedStyle(el);
      if (style.display === 'none' || style.visibility === 'hidden') continue;
      const box = el.getBoundingClientRect();
      if (box.width === 0 || box.height === 0) continue;
      // Only leaves and text holders: a wide container is reported through what it holds.
      if (box.right > width + 1 && el.children.length === 0 && !scrollsSideways(el)) {
        problems.push({ kind: 'beyond-the-window', what: describe(el), detail: `right edge at ${Math.round(box.right)} px of ${width}` });
      }
      const clamped = style.textOverflow === 'ellipsis' || (style.webkitLineClamp && style.webkitLineClamp !== 'none');
      if (clamped && (el.scrollWidth > el.clientWidth + 1 || el.scrollHeight > el.clientHeight + 1)) {
        problems.push({ kind: 'clipped-text', what: describe(el), detail: `${el.scrollWidth}×${el.scrollHeight} in ${el.clientWidth}×${el.clientHeight}` });
      }
    }
    return problems;
  });
}

type Box = { x: number; y: number; width: number; height: number };

/** The area two boxes share, in square pixels (0 when they only touch). */
export function overlapArea(a: Box, b: Box): number {
  const w = Math.min(a.x + a.width, b.x + b.width) - Math.max(a.x, b.x);
  const h = Math.min(a.y + a.height, b.y + b.height) - Math.max(a.y, b.y);
  return w > 0 && h > 0 ? w * h : 0;
}
