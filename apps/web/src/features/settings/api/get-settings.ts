// The settings query is app-wide (lib/shop-settings); the settings screen uses it from there.
export { getSettings, settingsKey, settingsQueryOptions, useSettings } from '../../../lib/shop-settings';
