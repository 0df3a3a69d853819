/**
 * The pre-flight check where a recipe meets a scenario on the command line (verify, advise): any
 * refusal stops the command as bad input (exit 2) with every refusal in plain words; warnings are
 * written to stderr and the command goes on.
 */
import { findingText, preflight } from '@/shared/engine/preflight/check';
import type { Finding } from '@/shared/engine/preflight/findings';
import type { Recipe } from '@/shared/engine/recipe';
import type { Scenario } from '@/shared/engine/scenario';
import { CliInputError } from './args';

/** Lines "scenario: sentence fix" for findings of one scenario. */
function lines(scenarioName: string, findings: Finding[]): string[] {
  return findings.map((f) => `"${scenarioName}": ${findingText(f)}`);
}

/** Checks the recipe on every scenario; throws CliInputError on refusals, prints warnings. */
export function checkBeforeRunning(recipe: Recipe, scenarios: Scenario[], stderr: (text: string) => void): void {
  const refused: string[] = [];
  for (const scenario of scenarios) {
    const result = preflight(recipe, scenario);
    refused.push(...lines(result.scenarioName, result.refusals));
    for (const line of lines(result.scenarioName, result.warnings)) stderr(`warning: ${line}\n`);
  }
  if (refused.length > 0) {
    throw new CliInputError(`recipe "${recipe.name}" cannot run:\n  ${refused.join('\n  ')}`);
  }
}
