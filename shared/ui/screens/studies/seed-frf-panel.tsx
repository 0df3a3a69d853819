/** The FRF plot of one seed, recomputed in the browser once the definitions are in. */
import { useEffect, useState } from 'react';
import type { Recipe, Scenario } from '@/shared/engine';
import type { ScenarioResult, Study } from '@/shared/api/work';
import { recipesApi } from '@/shared/ui/api/recipes';
import { scenariosApi } from '@/shared/ui/api/scenarios';
import { AppText } from '@/shared/ui/components';
import { FrfPlot, type FrfCurve, type ZoomBand } from '@/shared/ui/plots';
import { curveColors } from '@/shared/ui/theme';
import { Panel } from '../kit/panel';
import { ErrorBox, LoadingRow } from '../kit/query-view';
import { computeSeedFrf, type SeedFrf } from './seed-frf';

type Props = { labId: string; study: Study; scenario: ScenarioResult; position: number; zoomBands: ZoomBand[]; toleranceDb?: number };

type Computed = { status: 'working' } | { status: 'done'; frf: SeedFrf } | { status: 'failed'; error: unknown };

export function SeedFrfPanel({ labId, study, scenario, position, zoomBands, toleranceDb }: Props) {
  const recipe = recipesApi.useVersion(labId, study.recipe.id, study.recipe.version);
  const definition = scenariosApi.useVersion(labId, scenario.scenarioId, scenario.scenarioVersion);
  const [computed, setComputed] = useState<Computed>({ status: 'working' });
  const recipeDef = recipe.data?.definition as Recipe | undefined;
  const scenarioDef = definition.data?.definition as Scenario | undefined;
  useEffect(() => {
    if (!recipeDef || !scenarioDef) return;
    setComputed({ status: 'working' });
    // Let the page paint first: one seed takes from a few ms to a second.
    const timer = setTimeout(() => {
      try {
        setComputed({ status: 'done', frf: computeSeedFrf(scenarioDef, recipeDef, study.baseSeed, position) });
      } catch (error) {
        setComputed({ status: 'failed', error });
      }
    }, 30);
    return () => clearTimeout(timer);
  }, [recipeDef, scenarioDef, study.baseSeed, position]);

  if (recipe.isError || definition.isError) return <ErrorBox error={recipe.error ?? definition.error} title="The definitions for the FRF plot could not be loaded" />;
  if (computed.status === 'failed') return <ErrorBox error={computed.error} title="This seed could not be recomputed in the browser" />;
  if (computed.status === 'working')
    return (
      <Panel title="Estimated FRFs against the exact one">
        <LoadingRow label="Recomputing the first seed in your browser…" testID="seed-working" />
      </Panel>
    );
  const frf = computed.frf;
  const keyOf = { H1: 'h1', H2: 'h2', Hv: 'hv' } as const;
  const curves: FrfCurve[] = [
    { id: 'exact', label: 'Exact FRF', color: curveColors.exact, dashed: true, frequenciesHz: frf.frequenciesHz, frf: frf.exact },
    ...(['H1', 'H2', 'Hv'] as const).map((e): FrfCurve => ({
      id: keyOf[e],
      label: e === frf.estimator ? `${e} (the recipe's estimator, 95 % band)` : e,
      color: curveColors[keyOf[e]],
      frequenciesHz: frf.frequenciesHz,
      frf: frf[keyOf[e]],
      confidence: e === frf.estimator ? frf.confidence : undefined,
    })),
  ];
  return (
    <>
      <FrfPlot
        title="Estimated FRFs against the exact one"
        subtitle={`Seed ${frf.seed} (run 1 of this scenario), recomputed in your browser by the same engine`}
        unit={frf.unit}
        curves={curves}
        tolerance={toleranceDb === undefined ? undefined : { curveId: 'exact', db: toleranceDb }}
        zoomBands={zoomBands}
        testID="plot-frf"
      />
      {frf.warnings.length > 0 ? <AppText variant="small" tone="muted">{`Engine notes for this seed: ${frf.warnings.join(' ')}`}</AppText> : null}
    </>
  );
}
