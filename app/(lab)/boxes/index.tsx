import { BoxesScreen } from '@/components/boxes/boxes-screen';

export default function BoxesRoute() {
  return <BoxesScreen />;
}
