import { Page } from '../components/page';

export default function HomeRoute() {
  return (
    <Page title="The fig ripening atlas" intro="Which fig varieties actually ripen where you live, from growers’ own harvest reports.">
      <p className="text-ink/80">The map arrives with the atlas feature.</p>
    </Page>
  );
}
