import { Link } from 'expo-router';
import type { ReactNode } from 'react';
import { Pressable, View, type PressableProps, type StyleProp, type ViewStyle } from 'react-native';

type NavLinkProps = {
  href: string;
  label: string;
  active: boolean;
  /** `tab` in the phone's tab bar, `link` in the side rail and lists. */
  role: 'tab' | 'link';
  /** Layout of the link itself (static: Link's slot merges it with its own style). */
  containerStyle?: StyleProp<ViewStyle>;
  /** Look of the content, by interaction state. */
  style: (state: { pressed: boolean; hovered: boolean }) => StyleProp<ViewStyle>;
  children: ReactNode;
  testID?: string;
};

/**
 * A navigation item: a real link on the web (href, new tab, history), announced as a tab or a
 * link, with `aria-selected` / `aria-current` on the active one.
 */
export function NavLink({ href, label, active, role, containerStyle, style, children, testID }: NavLinkProps) {
  // aria-current is passed through by react-native-web but is not in React Native's types.
  const current = active && role === 'link' ? ({ 'aria-current': 'page' } as Partial<PressableProps>) : {};
  return (
    <Link href={href} asChild>
      <Pressable
        role={role}
        accessibilityLabel={label}
        aria-selected={role === 'tab' ? active : undefined}
        {...current}
        testID={testID}
        style={containerStyle}
      >
        {(state) => <View style={style(state as { pressed: boolean; hovered: boolean })}>{children}</View>}
      </Pressable>
    </Link>
  );
}
