import { useEffect, useState } from 'react';

/**
 * The text of an input over a stored value: while the input has focus it keeps exactly what was
 * typed (so nothing rounded is written back); otherwise it follows `shown`, the stored value as
 * displayed. On blur the text returns to `shown` and `onLeave` runs (e.g. to clear a message).
 */
export function useEditedText(shown: string, onLeave?: () => void) {
  const [text, setText] = useState(shown);
  const [focused, setFocused] = useState(false);
  useEffect(() => {
    if (!focused) setText(shown);
  }, [shown, focused]);
  return {
    text,
    setText,
    onFocus: () => setFocused(true),
    onBlur: () => {
      setFocused(false);
      onLeave?.();
      setText(shown);
    },
  };
}
