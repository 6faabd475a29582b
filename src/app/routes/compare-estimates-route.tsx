import { useSearchParams } from 'react-router-dom';
import { NotFoundContent } from '../../components/errors/not-found-page';
import { PageHeader } from '../../components/ui/page-header';
import { useComparison } from '../../features/estimates/api/compare-estimates';
import { EstimateComparison } from '../../features/estimates/components/estimate-comparison';
import { usePageTitle } from '../../lib/use-page-title';
import { PageQuery } from './page-query';

const isId = (v: string | null) => v !== null && /^[1-9]\d{0,9}$/.test(v);

export function CompareEstimatesRoute() {
  const [search] = useSearchParams();
  const a = search.get('a');
  const b = search.get('b');
  const valid = isId(a) && isId(b);
  const comparison = useComparison(Number(a), Number(b), valid);
  usePageTitle('Compare estimates');
  if (!valid) return <NotFoundContent />;
  return (
    <>
      <PageHeader title={`Estimates ${a} and ${b}`} lead="The same schedule with two systems or two merchants: quantities, weight and price." />
      <PageQuery query={comparison} what="the comparison">
        {(data) => <EstimateComparison comparison={data} />}
      </PageQuery>
    </>
  );
}
