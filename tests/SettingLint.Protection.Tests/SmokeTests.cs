namespace SettingLint.Protection.Tests;
public sealed class SmokeTests { [Fact] public void Builds() => Assert.True(true); }
