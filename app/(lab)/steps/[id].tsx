import { useLocalSearchParams } from 'expo-router';
import { StepScreen } from '@/components/steps/step-screen';

/** `?logged=1` marks the view shown straight after logging, which says so. */
export default function StepRoute() {
  const { id, logged } = useLocalSearchParams<{ id: string; logged?: string }>();
  const stepId = Number(id);
  return <StepScreen id={Number.isInteger(stepId) && stepId > 0 ? stepId : null} justLogged={logged === '1'} />;
}
