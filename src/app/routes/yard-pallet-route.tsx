import { useParams } from 'react-router-dom';
import { usePallet } from '../../features/runs/api/get-pallet';
import { PalletCard } from '../../features/runs/components/pallet-card';
import { runAbilitiesFor } from '../../features/runs/lib/run-abilities';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';
import { PageQuery } from './page-query';
import { idParam } from './route-loaders';

/** What a pallet label's QR code opens on a phone: the pallet, and one big button to mark it loaded. */
export function YardPalletRoute() {
  const params = useParams();
  const orderId = idParam(params, 'orderId');
  const palletNo = idParam(params, 'pallet');
  const pallet = usePallet(orderId, palletNo);
  const { user } = useCurrentSession();
  usePageTitle(pallet.data ? `Pallet ${pallet.data.pallet} of ${pallet.data.reference}` : 'Pallet');
  return (
    <div className="mx-auto max-w-lg">
      <PageQuery query={pallet} what="the pallet">
        {(found) => (
          <>
            <h1 className="mb-4 text-3xl font-bold">
              Pallet {found.pallet} of {found.pallets}
              <span className="block text-xl font-semibold text-ink-700">{found.reference}</span>
            </h1>
            <PalletCard pallet={found} canLoad={runAbilitiesFor(user.role).load} />
          </>
        )}
      </PageQuery>
    </div>
  );
}
