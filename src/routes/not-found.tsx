import { Link } from 'react-router';
import { Page } from '../components/page';

export default function NotFoundRoute() {
  return (
    <Page title="Nothing grows here">
      <p>
        This page does not exist.{' '}
        <Link to="/" className="font-medium text-fig-600 underline">
          Back to the atlas
        </Link>
      </p>
    </Page>
  );
}
