import { Page } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { useMailbox } from '../../features/mailbox/api/get-mailbox';
import { MailboxView } from '../../features/mailbox/components/mailbox-view';

export function Component() {
  const mail = useMailbox();
  return (
    <Page wide title="Mailbox" lead="Every message this installation has sent, caught by the local mail capture. Only present when the local stand-ins run.">
      <QueryState query={mail}>{(m) => <MailboxView messages={m} />}</QueryState>
    </Page>
  );
}
