import { useLocation } from 'react-router-dom';
import { ToastOutlet } from '../ui/toast';
import { CautionSlot } from './caution-slot';

/** The cautions and notes a routed public page shows above itself (see PublicLayout's `notices`). */
export function PublicNotices() {
  const location = useLocation();
  return (
    <>
      <CautionSlot />
      <ToastOutlet pageKey={location.pathname} />
    </>
  );
}
