import { makeStyles } from '@fluentui/react-components';
import { Page } from '../../components/page';
import { CircleFitCalculator } from '../../features/calculators/components/circle-fit-calculator';
import { EccentricityCalculator } from '../../features/calculators/components/eccentricity-calculator';
import { InsulationCalculator } from '../../features/calculators/components/insulation-calculator';
import { StackingFactorCalculator } from '../../features/calculators/components/stacking-factor-calculator';

const useStyles = makeStyles({
  grid: { display: 'grid', gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', gap: '20px', alignItems: 'start', '@media (max-width: 1200px)': { gridTemplateColumns: 'minmax(0, 1fr)' } },
});

/** The bench sheet's computations on their own, in the browser and checked against the API. */
export function CalculatorsPage() {
  const s = useStyles();
  return (
    <Page title="Calculators" lead="The maths the bench sheet uses, computed here as you type with the same functions the server runs. Check on server sends the same inputs to the API; nothing is stored.">
      <div className={s.grid}>
        <CircleFitCalculator />
        <EccentricityCalculator />
        <StackingFactorCalculator />
        <InsulationCalculator />
      </div>
    </Page>
  );
}
