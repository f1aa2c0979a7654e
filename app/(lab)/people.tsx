import { useLocalSearchParams } from 'expo-router';
import { PeopleScreen } from '@/components/people/people-screen';

/** `?person=<id>` selects someone, so a selection can be bookmarked and the back button undoes it. */
export default function PeopleRoute() {
  const { person } = useLocalSearchParams<{ person?: string }>();
  const id = Number(person);
  return <PeopleScreen selectedId={Number.isInteger(id) && id > 0 ? id : null} />;
}
