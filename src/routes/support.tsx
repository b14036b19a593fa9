import { useSearchParams } from 'react-router';
import { Page } from '../components/page';
import { SupportOffer } from '../features/support/components/support-offer';

export default function SupportRoute() {
  const [params] = useSearchParams();
  return (
    <Page
      title="Support the atlas"
      wide
      intro={
        <p className="max-w-2xl">
          Syconium is free and open: every map, number and download is there for every grower, member or not, and always will be. Members pay for the map and climate data, for the hours spent checking varieties and reports, and for new regions.
        </p>
      }
    >
      <div className="max-w-3xl">
        <SupportOffer returned={params.get('returned') === '1'} />
      </div>
    </Page>
  );
}
