namespace SettingLint.Reporting;
