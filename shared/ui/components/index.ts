export { AppText, type AppTextProps } from './app-text';
export { AreaIcon } from './area-icon';
export { Button, type ButtonProps } from './button';
export { Caution } from './caution';
export { EmptyState } from './empty-state';
export { PlumbMark } from './plumb-mark';
export { productName, Screen, useDocumentTitle } from './screen';
export { defaultStatusWords, StatusBadge, type StatusTone } from './status-badge';
export { TextField, type TextFieldProps } from './text-field';
