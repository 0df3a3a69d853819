/**
 * Modelling journey at 390 and 1280 px: an analyst builds a system and a scenario in the editors
 * and saves them through the real API (checked by reading them back), opens the what-if bench from
 * the Bench on that scenario, and sees the plots change when the noise moves from the response
 * channel to the force channel.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { expect, openPage, screenshot, SCREENSHOTS, signIn, type Harness, type ViewportName } from './harness';

const TIMEOUT = 30_000;

async function labId(page: Page): Promise<string> {
  const answer = (await (await page.request.get('/api/v1/auth/session')).json()) as { me: { memberships: { labId: string }[] } };
  return answer.me.memberships[0].labId;
}

async function h1Path(page: Page): Promise<string> {
  return page.getByTestId('what-if-frf-magnitude').locator('path[stroke="#1F7A8C"]').first().getAttribute('d').then((d) => d ?? '');
}

async function worstError(page: Page): Promise<string> {
  const row = page.getByTestId('what-if-summary').getByText('Largest |magnitude error| of H1 in the band').locator('..');
  return (await row.textContent()) ?? '';
}

async function waitUpToDate(page: Page) {
  await page.getByTestId('what-if-status').filter({ hasText: 'Up to date' }).waitFor({ timeout: TIMEOUT });
}

function journey(viewport: ViewportName) {
  const systemName = `Test arm bending (${viewport})`;
  const scenarioName = `Test arm under shaker (${viewport})`;
  return {
    name: `analyst builds a scenario and moves the noise on the what-if bench at ${viewport} width`,
    async run(h: Harness) {
      const { page, problems, close } = await openPage(h, viewport);
      try {
        await signIn(page, 'analyst@harborridge.test');
        await page.getByRole(viewport === 'phone' ? 'tablist' : 'navigation').first().waitFor({ timeout: TIMEOUT });
        const lab = await labId(page);

        // A system: one mode at 46 Hz, 1 % damping.
        await page.goto('/systems');
        await page.getByRole('button', { name: 'New system' }).click();
        await page.getByTestId('system-frf-magnitude').waitFor({ timeout: TIMEOUT });
        await page.getByLabel('Name', { exact: true }).fill(systemName);
        await page.getByLabel('Natural frequency fₙ (Hz)').fill('46');
        await page.getByLabel('Damping ratio ζ').fill('0.01');
        await page.getByTestId('mode-1').getByText('0.920 Hz').waitFor({ timeout: TIMEOUT }); // 2ζf_n
        await page.getByLabel('What this version changes').fill('first bending, from the tap test');
        await page.getByRole('button', { name: 'Save system' }).click();
        await page.waitForURL(/\/systems\/(?!new)[^/]+$/, { timeout: TIMEOUT });
        const systemId = page.url().split('/').pop()!;
        const storedSystem = (await (await page.request.get(`/api/v1/labs/${lab}/systems/${systemId}`)).json()) as { name: string; definition: { naturalFrequencyHz: number } };
        expect(storedSystem.name === systemName && storedSystem.definition.naturalFrequencyHz === 46, `the system was not stored as entered: ${JSON.stringify(storedSystem)}`);
        await screenshot(page, `modelling-system-${viewport}`);
        await page.getByTestId('system-facts').scrollIntoViewIfNeeded();
        await screenshot(page, `modelling-system-facts-${viewport}`);

        // A scenario on that system (random 10–150 Hz at 512 Hz, noise on the response).
        await page.goto('/scenarios/new');
        await page.getByTestId('scenario-signals').waitFor({ timeout: TIMEOUT });
        await page.getByLabel('Name', { exact: true }).fill(scenarioName);
        await page.getByTestId('system-select').selectOption({ label: `${systemName} (v1)` });
        await page.getByRole('button', { name: 'Use this system' }).click();
        await page.getByTestId('scenario-system-summary').filter({ hasText: 'mode at 46.00 Hz' }).waitFor({ timeout: TIMEOUT });
        await page.getByRole('button', { name: 'Save scenario' }).click();
        await page.waitForURL(/\/scenarios\/(?!new)[^/]+$/, { timeout: TIMEOUT });
        const scenarioId = page.url().split('/').pop()!;
        const storedScenario = (await (await page.request.get(`/api/v1/labs/${lab}/scenarios/${scenarioId}`)).json()) as {
          definition: { system: { naturalFrequencyHz: number }; errors: { outputNoise?: { snrDb: number } } };
        };
        expect(storedScenario.definition.system.naturalFrequencyHz === 46, 'the scenario does not hold the new system');
        expect(storedScenario.definition.errors.outputNoise?.snrDb === 20, 'the scenario lost its response-channel noise');
        await page.getByTestId('scenario-signals-force').waitFor({ timeout: TIMEOUT });
        await screenshot(page, `modelling-scenario-${viewport}`);
        await page.getByTestId('scenario-signals').scrollIntoViewIfNeeded();
        await screenshot(page, `modelling-scenario-signals-${viewport}`);

        // The what-if bench, from the Bench, on that scenario.
        await page.goto('/');
        await page.getByTestId('what-if-link').waitFor({ timeout: TIMEOUT });
        await screenshot(page, `modelling-bench-${viewport}`);
        await page.getByTestId('what-if-link').click();
        await page.waitForURL(/\/bench\/what-if$/, { timeout: TIMEOUT });
        await waitUpToDate(page);
        await page.getByLabel("Or one of the lab's scenarios").selectOption({ label: scenarioName });
        await page.getByTestId('what-if-summary').waitFor({ timeout: TIMEOUT });
        await waitUpToDate(page);
        expect((await page.getByRole('radio', { name: 'On the response' }).getAttribute('aria-checked')) === 'true', 'the bench did not start from the scenario’s response noise');
        const before = { path: await h1Path(page), worst: await worstError(page), time: await page.getByTestId('what-if-time').textContent() };
        await page.getByTestId('what-if-frf').scrollIntoViewIfNeeded();
        await screenshot(page, `modelling-what-if-output-noise-${viewport}`);

        await page.getByRole('radio', { name: 'On the force' }).click();
        await page.waitForFunction((old) => {
          const frame = document.querySelector('[data-testid="what-if-frf-magnitude"]');
          const path = frame?.querySelector('path[stroke="#1F7A8C"]')?.getAttribute('d');
          return !!path && path !== old;
        }, before.path, { timeout: TIMEOUT });
        await waitUpToDate(page);
        const after = { path: await h1Path(page), worst: await worstError(page), time: await page.getByTestId('what-if-time').textContent() };
        expect(after.path !== before.path, 'the H1 curve did not change when the noise moved to the force');
        expect(after.worst !== before.worst, `the worst H1 error did not change (${before.worst})`);
        console.log(`    ${viewport}: noise on the response → ${before.worst}; on the force → ${after.worst}; ${after.time}`);
        await page.getByTestId('what-if-frf').scrollIntoViewIfNeeded();
        await screenshot(page, `modelling-what-if-input-noise-${viewport}`);
        await page.getByTestId('what-if-error').scrollIntoViewIfNeeded();
        await screenshot(page, `modelling-what-if-error-${viewport}`);
        // Export of the FRF plot as SVG and PNG, as files the browser downloads.
        const frf = page.getByTestId('what-if-frf');
        const [svgFile] = await Promise.all([page.waitForEvent('download'), frf.getByRole('button', { name: 'Export SVG' }).click()]);
        const svgText = fs.readFileSync((await svgFile.path())!, 'utf8');
        expect(svgFile.suggestedFilename() === 'exact-frf-and-the-three-estimates.svg', `SVG file name ${svgFile.suggestedFilename()}`);
        expect(svgText.startsWith('<?xml') && svgText.includes('<path') && svgText.includes('Phase · degrees'), 'the SVG export lacks its curves or captions');
        const [pngFile] = await Promise.all([page.waitForEvent('download'), frf.getByRole('button', { name: 'Export PNG' }).click()]);
        const png = fs.readFileSync((await pngFile.path())!);
        expect(png.subarray(1, 4).toString('ascii') === 'PNG' && png.length > 10_000, `the PNG export is not an image (${png.length} bytes)`);
        fs.writeFileSync(path.join(SCREENSHOTS, `modelling-export-${viewport}.png`), png);
        expect(problems.length === 0, `console errors:\n${problems.join('\n')}`);
      } catch (err) {
        await screenshot(page, `modelling-failure-${viewport}`).catch(() => undefined);
        throw err;
      } finally {
        await close();
      }
    },
  };
}

export const journeys = [journey('phone'), journey('wide')];
