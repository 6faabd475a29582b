import { useParams } from 'react-router-dom';
import { PublicLayout } from '../../components/layout/public-layout';
import { PublicNotices } from '../../components/layout/public-notices';
import { PageHeader } from '../../components/ui/page-header';
import { OutboxReader } from '../../features/outbox/components/outbox-reader';
import { usePageTitle } from '../../lib/use-page-title';

export function OutboxRoute() {
  usePageTitle('Outbox');
  const { messageId } = useParams();
  const selectedId = messageId && /^\d+$/.test(messageId) ? Number(messageId) : null;
  return (
    <PublicLayout wide notices={<PublicNotices />}>
      <PageHeader title="Outbox" lead="The e-mails this server has sent, caught by its local mail fake so nothing leaves the machine." />
      <OutboxReader selectedId={selectedId} hrefFor={(id) => `/outbox/${id}`} listHref="/outbox" />
    </PublicLayout>
  );
}
