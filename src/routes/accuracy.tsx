import { Page } from '../components/page';
import { AccuracyView } from '../features/accuracy/components/accuracy-view';

export default function AccuracyRoute() {
  return (
    <Page title="How good are these odds?" intro="Every chance in What ripens here is tested against growers it has never seen. Here is how it scores." wide>
      <AccuracyView />
    </Page>
  );
}
