/**
 * `data-*` attributes on react-native-web views (its `dataSet` prop, which React Native's types do
 * not declare). The plot export finds frames, captions and legend entries by them.
 */
export function webData(data: Record<string, string>): object {
  return { dataSet: data };
}

/** Web-only props react-native-web forwards to the element (e.g. `onKeyDown`), untyped in React Native. */
export function webProps(props: Record<string, unknown>): object {
  return props;
}
