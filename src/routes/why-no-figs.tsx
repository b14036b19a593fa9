import { Page } from '../components/page';
import { DiagnosisStepper } from '../features/guidance/components/diagnosis-stepper';

export default function WhyNoFigsRoute() {
  return (
    <Page title="Why no figs?" intro="A short guided check: tell us what you saw, answer a few questions, and get the likely causes with what to try next season.">
      <DiagnosisStepper />
    </Page>
  );
}
