import { PageHeader } from '../../components/ui/page-header';
import { FleetManager } from '../../features/fleet/components/fleet-manager';
import { usePageTitle } from '../../lib/use-page-title';

export function FleetRoute() {
  usePageTitle('Lorries and slots');
  return (
    <>
      <PageHeader title="Lorries and slots" lead="Each branch's lorries, what they carry and lift, and the delivery slots they offer." />
      <FleetManager />
    </>
  );
}
