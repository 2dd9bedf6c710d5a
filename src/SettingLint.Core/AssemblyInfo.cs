namespace SettingLint.Core;
