import { SignInScreen } from '@/components/auth/sign-in-screen';
import { useNextPath } from '@/hooks/use-next-path';

export default function SignInRoute() {
  const nextPath = useNextPath();
  return <SignInScreen nextPath={nextPath} />;
}
