/**
 * Home (the Bench): studies running with live progress, reviews waiting for me, standards falling
 * due, and recent results; each with its own empty state.
 */
import { StyleSheet, View } from 'react-native';
import { useSession } from '@/shared/ui/api/use-session';
import { useCurrentLab } from '@/shared/ui/lab-context';
import { useWideLayout } from '@/shared/ui/navigation/use-wide-layout';
import { space } from '@/shared/ui/theme';
import { PageHead } from '../kit/panel';
import { WhatIfLink } from '../what-if/what-if-link';
import { Column } from '../kit/two-pane';
import { DueStandards, RecentResults, ReturnedToYou, RunningStudies, WaitingReviews } from './home-sections';

function firstName(displayName: string) {
  return displayName.trim().split(/\s+/)[0] ?? displayName;
}

export function HomeScreen() {
  const session = useSession();
  const lab = useCurrentLab();
  const wide = useWideLayout();
  const labId = lab?.labId ?? '';
  const name = session.status === 'signed-in' ? firstName(session.me.user.displayName) : '';
  return (
    <Column title="Bench">
      <PageHead title="Bench" eyebrow={name ? `Welcome, ${name}` : 'Welcome'} intro={lab ? `${lab.labName}: your work in progress, and what is waiting for you.` : 'You are not a member of any lab yet.'} actions={<WhatIfLink />} />
      {lab?.role === 'analyst' && session.status === 'signed-in' ? <ReturnedToYou labId={labId} userId={session.me.user.id} /> : null}
      <View style={[styles.grid, wide && styles.gridWide]}>
        <View style={[styles.col, wide && styles.colWide]}>
          <RunningStudies labId={labId} canStart={lab?.role === 'analyst'} />
          <RecentResults labId={labId} />
        </View>
        <View style={[styles.col, wide && styles.colWide]}>
          <WaitingReviews labId={labId} role={lab?.role ?? null} />
          <DueStandards labId={labId} />
        </View>
      </View>
    </Column>
  );
}

const styles = StyleSheet.create({
  grid: { gap: space.lg },
  gridWide: { flexDirection: 'row', alignItems: 'flex-start' },
  col: { gap: space.lg },
  colWide: { flex: 1, minWidth: 0 },
});
