import { Text, type TextProps } from 'react-native';
import { type as typeScale } from '@/constants/theme';

type Props = TextProps & { variant?: keyof typeof typeScale };

/** Text in one of the theme's type styles; headings carry the heading role for screen readers. */
export function AppText({ variant = 'body', style, ...rest }: Props) {
  const isHeading = variant === 'title' || variant === 'heading';
  return (
    <Text
      role={isHeading ? 'heading' : undefined}
      aria-level={variant === 'title' ? 1 : variant === 'heading' ? 2 : undefined}
      style={[typeScale[variant], style]}
      {...rest}
    />
  );
}
