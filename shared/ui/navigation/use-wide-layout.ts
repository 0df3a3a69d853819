import { useWindowDimensions } from 'react-native';
import { layout } from '@/shared/ui/theme';

/** True at window widths where the side rail replaces the bottom tab bar. */
export function useWideLayout(): boolean {
  const { width } = useWindowDimensions();
  return width >= layout.wideBreakpoint;
}
