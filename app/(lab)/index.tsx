import { Redirect } from 'expo-router';
import { LAB_HOME } from '@/hooks/use-next-path';

/** The lab area has no home screen of its own yet; the account screen is where everyone can go. */
export default function LabIndex() {
  return <Redirect href={LAB_HOME} />;
}
