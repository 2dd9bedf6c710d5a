namespace SettingLint.Protection;
