import { ROLE_LABELS, WRITER_ROLES, type Role } from '@/shared/roles';
import type { User } from '@/shared/schemas/user';
import { EmptyState } from '@/components/ui/state-views';

/** Lab managers and researchers change records; reviewers read them. The server decides either way. */
export function canWriteSamples(user: User | undefined): boolean {
  return user !== undefined && WRITER_ROLES.includes(user.role);
}

export function canRetireSamples(user: User | undefined): boolean {
  return user?.role === 'manager';
}

/** What a reviewer sees on a form they reached by link. */
export function WritersOnlyState({ task, role }: { task: string; role: Role | undefined }) {
  return (
    <EmptyState icon="lock-closed-outline" title={`Only researchers and lab managers can ${task}`} testID="writers-only">
      {`${role ? `As a ${ROLE_LABELS[role].toLowerCase()} you` : 'You'} can read every record and its history. Ask a researcher in your group if something needs recording.`}
    </EmptyState>
  );
}
