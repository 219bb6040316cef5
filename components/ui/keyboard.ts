/** The part of a browser key event a control reads. */
export type KeyEvent = { key: string; preventDefault(): void; currentTarget?: unknown };

/**
 * Props that give a Pressable a key handler on the web (react-native-web passes `onKeyDown` to the
 * element; React Native's own types do not list it). Native platforms ignore it.
 */
export function onKeyDownProps(handler: (event: KeyEvent) => void): object {
  return { onKeyDown: handler };
}

/**
 * Space presses a checkbox, radio or switch, as it does a native one. (react-native-web's Pressable
 * answers Space only for the button role; Enter it handles for every role.)
 */
export function spacePresses(onPress: () => void): object {
  return onKeyDownProps((event) => {
    if (event.key === ' ' || event.key === 'Spacebar') {
      event.preventDefault();
      onPress();
    }
  });
}

type Focusable = { focus?: () => void };

/**
 * Moves the focus to the `index`-th control beside the one the key was pressed on (its siblings
 * in the same row), as arrow keys do in a group. Keys reach us only on the web, where the target
 * is a DOM element.
 */
export function focusSibling(event: KeyEvent, index: number): void {
  const el = event.currentTarget as { parentElement?: { children?: ArrayLike<Focusable> } } | undefined;
  el?.parentElement?.children?.[index]?.focus?.();
}

/** Where the arrow keys move in a one-dimensional group, or null for other keys. */
export function arrowStep(key: string, index: number, count: number): number | null {
  if (count === 0) return null;
  switch (key) {
    case 'ArrowRight':
    case 'ArrowDown':
      return (index + 1) % count;
    case 'ArrowLeft':
    case 'ArrowUp':
      return (index - 1 + count) % count;
    case 'Home':
      return 0;
    case 'End':
      return count - 1;
    default:
      return null;
  }
}
