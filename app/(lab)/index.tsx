import { Redirect } from 'expo-router';

/** The lab area opens on the bench: logging a run as it happens is what people come for. */
export default function LabIndex() {
  return <Redirect href="/bench" />;
}
