import { lazy, Suspense } from 'react';
import { SectionBoundary } from '../../components/errors/section-boundary';
import type { RenderFaceDrawing } from '../../features/deliveries/components/drop-parts';
import { DriverToday } from '../../features/deliveries/components/driver-today';
import { BranchList } from '../../features/organisation/components/branch-list';
import { firstName } from '../../lib/format';
import { usePageTitle } from '../../lib/use-page-title';
import { useCurrentSession } from '../current-session';
import { SkeletonBlock } from '../../components/ui/skeleton';
import { RoleHome } from './role-home';

/**
 * The driver's landing plan draws each face with the estimate's own face drawing. Its geometry loads when a
 * drop's landing plan is opened, not with the day's list; the service worker keeps it with the driver's pages.
 */
const LandingFaceDrawing = lazy(() => import('./landing-face-drawing').then((m) => ({ default: m.LandingFaceDrawing })));

const renderFaceDrawing: RenderFaceDrawing = (drawing, system) => (
  <Suspense fallback={<SkeletonBlock label="Loading the stack drawing" lines={3} />}>
    <LandingFaceDrawing drawing={drawing} system={system} />
  </Suspense>
);

/** Phone-first: big type, one column, targets a gloved thumb can hit. */
export function DriverHomeRoute() {
  usePageTitle('On the road');
  const { user, organisation } = useCurrentSession();
  return (
    <RoleHome role={user.role}>
      <header className="mb-6">
        <p className="text-xl text-ink-700">Hello, {firstName(user.name)}.</p>
        <h1 className="mt-1 text-3xl font-bold sm:text-4xl">On the road</h1>
        <p className="mt-2 text-lg text-ink-700">Driving for {organisation.name}</p>
      </header>
      <div className="space-y-8 text-lg">
        <SectionBoundary name="day">
          <DriverToday driverId={user.id} renderFaceDrawing={renderFaceDrawing} />
        </SectionBoundary>
        <SectionBoundary name="branches">
          <BranchList title="Your branches" large />
        </SectionBoundary>
      </div>
    </RoleHome>
  );
}
