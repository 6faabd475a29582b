import { can } from '../../../shared/domain/policy';
import { PageHeader } from '../../components/ui/page-header';
import { CatalogueBoard } from '../../features/catalogue/components/catalogue-board';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';

export function CatalogueRoute() {
  usePageTitle('Catalogue and stock');
  const { user } = useCurrentSession();
  return (
    <>
      <PageHeader title="Catalogue and stock" lead="What each branch sells, at what price, and what is free to promise." />
      <CatalogueBoard canImportPrices={can(user.role, 'catalogue:manage')} canImportStock={can(user.role, 'stock:manage')} />
    </>
  );
}
