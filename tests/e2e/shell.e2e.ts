/** Smoke journey: the sign-in screen renders with the shipped font, a demo user signs in and
 * sees the signed-in shell (bottom tab bar on a phone, side rail on a wide screen). */
import { expect, openPage, screenshot, signIn, type Harness, type ViewportName } from './harness';

async function fontInUse(page: import('playwright-core').Page, label: string): Promise<string> {
  const text = page.getByRole('button', { name: label }).getByText(label, { exact: true }).first();
  return text.evaluate((el) => getComputedStyle(el).fontFamily);
}

function journey(viewport: ViewportName) {
  return {
    name: `sign-in and shell at ${viewport} width`,
    async run(h: Harness) {
      const { page, problems, close } = await openPage(h, viewport);
      try {
        await page.goto('/');
        await page.getByLabel('E-mail').waitFor({ timeout: 20_000 });
        await page.evaluate(() => document.fonts.ready);
        const families = await page.evaluate(() => {
          const loaded: string[] = [];
          document.fonts.forEach((f) => {
            if (f.status === 'loaded') loaded.push(f.family);
          });
          return loaded;
        });
        expect(
          families.some((f) => /Atkinson/i.test(f)),
          `the shipped interface font is not loaded (loaded: ${families.join(', ') || 'none'})`,
        );
        const family = await fontInUse(page, 'Sign in');
        expect(/Atkinson/i.test(family), `the sign-in button is not set in the shipped font (${family})`);
        await screenshot(page, `sign-in-${viewport}`);

        await signIn(page, 'analyst@harborridge.test');
        const nav = page.getByRole(viewport === 'phone' ? 'tablist' : 'navigation').first();
        await nav.waitFor({ timeout: 20_000 });
        expect(await nav.getByText('Systems').first().isVisible(), 'the navigation does not show Systems');
        expect(await page.getByText('Harbor Ridge Test Lab').first().isVisible(), 'the lab name is not shown');
        const box = await nav.boundingBox();
        expect(box, 'the navigation has no box');
        if (viewport === 'phone') {
          expect(box.y + box.height >= 844 - 2 && box.width >= 380, `the tab bar is not at the bottom (${JSON.stringify(box)})`);
        } else {
          expect(box.x <= 1 && box.height >= 700 && box.width < 400, `the rail is not at the left (${JSON.stringify(box)})`);
        }
        await screenshot(page, `shell-${viewport}`);
        expect(problems.length === 0, `console errors:\n${problems.join('\n')}`);
      } finally {
        await close();
      }
    },
  };
}

export const journeys = [journey('phone'), journey('wide')];
