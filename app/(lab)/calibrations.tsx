import { CalibrationsScreen } from '@/components/evidence/calibrations-screen';

/** Micrometres per pixel for each microscope and objective. */
export default function CalibrationsRoute() {
  return <CalibrationsScreen />;
}
