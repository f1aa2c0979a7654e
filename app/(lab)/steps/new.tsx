import { useLocalSearchParams } from 'expo-router';
import { LogStepScreen } from '@/components/steps/log-step-screen';

/** `?input=<code>` starts the step with that sample as its input ("Log a step from this sample"). */
export default function LogStepRoute() {
  const { input } = useLocalSearchParams<{ input?: string }>();
  return <LogStepScreen inputCode={typeof input === 'string' && input.trim() ? input.trim() : null} />;
}
