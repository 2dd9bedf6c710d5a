namespace SettingLint.Cli.Tests;
public sealed class SmokeTests { [Fact] public void Builds() => Assert.True(true); }
