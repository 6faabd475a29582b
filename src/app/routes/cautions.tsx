import { useParams } from 'react-router-dom';
import { SAFETY_CAUTIONS } from '../../../shared/engine/defaults';
import { useEstimate } from '../../features/estimates/api/get-estimate';
import { useOrder } from '../../features/orders/api/get-order';

const SHORT = {
  height: 'Roof work is work at height: plan it to avoid, prevent, then limit falls.',
  loading: 'Load the roof evenly on both slopes and only where the structure can take it; a structural engineer decides what it can carry.',
  lifting: 'Lifting pallets, and any crane lift onto the roof, needs a lift plan by a competent person.',
  figures: "These figures are estimates: check them against the tile maker's fixing specification for the site and local building regulations, which take precedence.",
};

function CautionBody({ points, full }: { points: string[]; full: readonly string[] }) {
  return (
    <div className="space-y-2">
      <ul className="list-disc space-y-1 pl-5">
        {points.map((point) => (
          <li key={point}>{point}</li>
        ))}
      </ul>
      {full.length > 0 ? (
        <details>
          <summary className="min-h-tap cursor-pointer content-center font-semibold">All the safety notes ({full.length})</summary>
          <ul className="mt-1 list-disc space-y-1 pl-5">
            {full.map((text) => (
              <li key={text}>{text}</li>
            ))}
          </ul>
        </details>
      ) : null}
    </div>
  );
}

/** The estimate's cautions: the engine's and the server's words in full once the estimate is loaded. */
export function EstimateCaution() {
  const params = useParams();
  const estimate = useEstimate(Number(params.estimateId ?? 0));
  return <CautionBody points={[SHORT.height, SHORT.loading, SHORT.lifting, SHORT.figures]} full={estimate.data?.cautions ?? SAFETY_CAUTIONS} />;
}

/** Making an estimate: the figures are the engine's, to be checked before anything is ordered or fixed. */
export function NewEstimateCaution() {
  return <CautionBody points={[SHORT.figures, SHORT.loading]} full={SAFETY_CAUTIONS} />;
}

/** The face drawing shows where stacks go: loading comes first. */
export function FaceDrawingCaution() {
  const params = useParams();
  const estimate = useEstimate(Number(params.estimateId ?? 0));
  return (
    <CautionBody
      points={['The stacks show an even spread over the rafters, every few battens from the top: load both slopes in step, and only braced rafters or trusses.', SHORT.height, SHORT.figures]}
      full={estimate.data?.cautions ?? SAFETY_CAUTIONS}
    />
  );
}

/** Placing an order: lifting and set-down come with every delivery. */
export function PlaceOrderCaution() {
  return <CautionBody points={[SHORT.lifting, SHORT.loading, SHORT.figures]} full={SAFETY_CAUTIONS} />;
}

/** An order's cautions: the server's delivery-specific ones (crane, overhead lines, ground handling) first. */
export function OrderCaution() {
  const params = useParams();
  const order = useOrder(Number(params.orderId ?? 0));
  const full = order.data?.cautions ?? SAFETY_CAUTIONS;
  return <CautionBody points={order.data ? [order.data.cautions[0] ?? SHORT.lifting, SHORT.height, SHORT.figures] : [SHORT.lifting, SHORT.height, SHORT.figures]} full={full} />;
}

/** Building a lorry's load: securing, weights and lifting come before the lorry moves. */
export function YardLoadingCaution() {
  return (
    <CautionBody
      points={[
        'Only trained operators lift pallets with a forklift or crane; nobody stands under, beside or on a load being lifted or on the lorry bed while it is loaded.',
        'Secure every pallet before the lorry moves, and keep within its payload and axle weights: the deck plan balances the load as a guide, not as a weighbridge.',
        SHORT.lifting,
      ]}
      full={SAFETY_CAUTIONS}
    />
  );
}

/** A pallet's page on a phone in the yard: the one caution first, the rest a tap away, the button in reach. */
export function YardPalletCaution() {
  return <CautionBody points={['Only trained operators lift pallets; nobody stands under, beside or on a load being lifted.']} full={SAFETY_CAUTIONS} />;
}
