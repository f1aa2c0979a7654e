import { Redirect } from 'expo-router';

/** The lab area opens on the sample list: finding a sample is what people come for. */
export default function LabIndex() {
  return <Redirect href="/samples" />;
}
