import { IconContrast } from './icons';
import { MenuButton } from './menu-button';
import { useTheme, type ThemeChoice } from './theme';

const choices: Array<{ value: ThemeChoice; label: string; detail: string }> = [
  { value: 'system', label: 'Same as this device', detail: 'Follows the light or dark setting' },
  { value: 'light', label: 'Light', detail: 'Paper ground, dark ink' },
  { value: 'dark', label: 'Dark', detail: 'For dim workshops' },
];

/** A menu to choose light, dark or the device's setting. */
export function ThemeMenu({ className }: { className?: string }) {
  const [choice, setChoice] = useTheme();
  return (
    <MenuButton
      label="Theme"
      icon={<IconContrast size={18} />}
      variant="ghost"
      align="start"
      side="top"
      className={className}
      items={choices.map((c) => ({
        key: c.value,
        label: c.label,
        detail: c.detail,
        current: c.value === choice,
        onSelect: () => setChoice(c.value),
      }))}
    />
  );
}
