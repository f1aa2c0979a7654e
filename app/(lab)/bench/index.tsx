import { BenchScreen } from '@/components/bench/bench-screen';

export default function BenchRoute() {
  return <BenchScreen />;
}
