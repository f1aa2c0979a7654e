import { PlanningScreen } from '@/components/evidence/planning-screen';

/** Predicted monolayer contrast against oxide thickness and wavelength, for choosing substrates. */
export default function PlanningRoute() {
  return <PlanningScreen />;
}
