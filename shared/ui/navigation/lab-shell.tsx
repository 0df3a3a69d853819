import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import type { MeResponse } from '@/shared/api/auth';
import { colors } from '@/shared/ui/theme';
import { ShellHeader } from './shell-header';
import { SideRail } from './side-rail';
import { TabBar } from './tab-bar';
import { useWideLayout } from './use-wide-layout';

type LabShellProps = { me: MeResponse; pathname: string; children: ReactNode };

/** The signed-in frame: side rail on wide windows, header on top and tab bar below on phones. */
export function LabShell({ me, pathname, children }: LabShellProps) {
  const wide = useWideLayout();
  if (wide) {
    return (
      <View style={styles.row}>
        <SideRail pathname={pathname} />
        <View style={styles.column}>
          <ShellHeader me={me} showBrand={false} />
          <View role="main" style={styles.main}>
            {children}
          </View>
        </View>
      </View>
    );
  }
  return (
    <View style={styles.column}>
      <ShellHeader me={me} showBrand />
      <View role="main" style={styles.main}>
        {children}
      </View>
      <TabBar pathname={pathname} />
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flex: 1, flexDirection: 'row', backgroundColor: colors.background },
  column: { flex: 1, backgroundColor: colors.background },
  main: { flex: 1 },
});
