import { Body1, Caption1, MessageBar, MessageBarBody, MessageBarTitle, Subtitle2, makeStyles, tokens } from '@fluentui/react-components';
import type { ChartResponse, Forecast } from '@shared/schemas/drift';
import { fmt } from './chart-data';

const useStyles = makeStyles({
  card: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '14px 16px', backgroundColor: tokens.colorNeutralBackground1, display: 'flex', flexDirection: 'column', gap: '10px' },
  big: { fontSize: tokens.fontSizeBase500, lineHeight: tokens.lineHeightBase500, fontWeight: 600 },
  muted: { color: tokens.colorNeutralForeground3 },
});

/** Whole lots, rounded down: "about 7 lots" must not promise a lot more than the line does. */
export const lotsText = (n: number | null | undefined): string => (n == null ? '—' : `${Math.floor(n)} lot${Math.floor(n) === 1 ? '' : 's'}`);

export function forecastSentence(f: Forecast, what: string): string {
  if (f.lotsToLimit === null) return `No upward trend over the last ${f.lotsUsed} lots.`;
  if (f.lotsToLimit === 0) return `The wear trend has reached the ${what} limit.`;
  return `About ${lotsText(f.lotsToLimit)} left before the ${what} limit; conservative ${lotsText(f.lotsToLimitLower)}.`;
}

export function ForecastPanel({ chart }: { chart: ChartResponse }) {
  const s = useStyles();
  const f = chart.forecast;
  const what = chart.characteristic.name.toLowerCase();
  const unit = chart.characteristic.unit ?? '';
  return (
    <section className={s.card} aria-label="Die-wear forecast">
      <Subtitle2 as="h2">Die-wear forecast</Subtitle2>
      {f ? (
        <>
          <Body1 className={s.big}>{forecastSentence(f, what)}</Body1>
          {f.serviceDue ? (
            <MessageBar intent="error" layout="multiline">
              <MessageBarBody>
                <MessageBarTitle>Die service due</MessageBarTitle>
                Fewer than {f.serviceLots} lots remain on the conservative forecast. Ask {chart.supplier.name} to resharpen or service the die before the next lots.
              </MessageBarBody>
            </MessageBar>
          ) : null}
          <Caption1 className={s.muted}>
            Straight line through every reading of the last {f.lotsUsed} lots (lots {f.firstLotSeq}–{f.lastLotSeq} of this supplier’s history): {f.slope >= 0 ? '+' : ''}
            {fmt(f.slope)} {unit} per lot, R² {fmt(f.r2, 2)}. The conservative count uses the {Math.round(f.confidence * 100)} % upper prediction bound for a single reading against
            the upper limit {fmt(f.usl)} {unit}. The notice shows below {f.serviceLots} lots.
          </Caption1>
        </>
      ) : (
        <Body1 className={s.muted}>{chart.forecastNote ?? 'No forecast for this characteristic.'}</Body1>
      )}
    </section>
  );
}
