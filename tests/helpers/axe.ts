import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

export type AxeFinding = { id: string; impact: string; help: string; targets: string[] };

/**
 * Runs axe-core inside the page as it stands (evaluated through the browser's debugging channel,
 * so our content security policy does not need to allow it) and returns the violations of the
 * given impacts.
 */
export async function axeViolations(
  page: Page,
  impacts: string[] = ['serious', 'critical'],
): Promise<AxeFinding[]> {
  await page.evaluate(axeSource);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document) => Promise<{ violations: unknown[] }> } })
      .axe;
    const result = await axe.run(document);
    return result.violations as {
      id: string;
      impact: string;
      help: string;
      nodes: { target: string[] }[];
    }[];
  });
  return violations
    .filter((v) => impacts.includes(v.impact))
    .map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      targets: v.nodes.map((n) => n.target.join(' ')),
    }));
}

/** Presses Tab until the element matching `selector` has focus; false if it is never reached. */
export async function tabTo(page: Page, selector: string, maxTabs = 60): Promise<boolean> {
  for (let i = 0; i < maxTabs; i++) {
    if (await page.evaluate((s) => document.activeElement?.matches(s) ?? false, selector)) return true;
    await page.keyboard.press('Tab');
  }
  return false;
}
