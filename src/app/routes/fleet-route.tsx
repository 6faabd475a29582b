import { PageHeader } from '../../components/ui/page-header';
import { FleetManager } from '../../features/fleet/components/fleet-manager';
import { can } from '../../../shared/domain/policy';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';

export function FleetRoute() {
  usePageTitle('Lorries and slots');
  const { user } = useCurrentSession();
  return (
    <>
      <PageHeader title="Lorries and slots" lead="Each branch's lorries, what they carry and lift, and the delivery slots they offer." />
      <FleetManager canManage={can(user.role, 'fleet:manage')} />
    </>
  );
}
