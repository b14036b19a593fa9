import { Page } from '../components/page';
import { DevMailbox } from '../features/email/components/dev-mailbox';

export default function DevMailRoute() {
  return (
    <Page wide title="Development mailbox" intro="Every message the app sent while running in development, caught by its local mail server. Nothing here left this machine.">
      <DevMailbox />
    </Page>
  );
}
