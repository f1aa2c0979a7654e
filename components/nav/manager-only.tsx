import { EmptyState } from '@/components/ui/state-views';

/** What someone sees on a lab-manager screen they reached by link: why not, and who can help. */
export function ManagerOnlyState({ task }: { task: string }) {
  return (
    <EmptyState icon="lock-closed-outline" title={`Only a lab manager can ${task}`} testID="manager-only">
      Your role does not include this. If you need it, ask one of the lab managers in your group.
    </EmptyState>
  );
}
