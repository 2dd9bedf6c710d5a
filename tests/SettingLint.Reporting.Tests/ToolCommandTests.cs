namespace SettingLint.Reporting.Tests;

/// <summary>Messages that name a command give one the user can run, installed or not.</summary>
public sealed class ToolCommandTests
{
    [Fact]
    public void The_installed_tool_on_the_path_is_named_plainly()
    {
        var dir = Path.Combine(Path.GetTempPath(), "settinglint-path-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(dir);
        try
        {
            File.WriteAllText(Path.Combine(dir, "settinglint"), "");
            Assert.Equal("settinglint", ToolCommand.Resolve("/nowhere" + Path.PathSeparator + dir, "/usr/share/dotnet/dotnet", "/src/bin/settinglint.dll"));
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }

    [Theory]
    // After `dotnet run` or `dotnet settinglint.dll`: the host is dotnet and the tool is its main assembly.
    [InlineData("/usr/share/dotnet/dotnet", "/src/SettingLint.Cli/bin/Debug/net10.0/settinglint.dll", "dotnet /src/SettingLint.Cli/bin/Debug/net10.0/settinglint.dll")]
    [InlineData("/usr/share/dotnet/dotnet", "/my tools/settinglint.dll", "dotnet '/my tools/settinglint.dll'")]
    // The executable a publish makes, started by its path.
    [InlineData("/opt/settinglint-1.0/settinglint", null, "/opt/settinglint-1.0/settinglint")]
    public void Without_the_installed_tool_the_command_is_how_this_process_was_started(string process, string? dll, string expected) =>
        Assert.Equal(expected, ToolCommand.Resolve("/nowhere", process, dll));

    [Fact]
    public void The_text_legend_names_the_command_of_the_context()
    {
        var text = Samples.Render(new TextReporter(), Samples.Result(), Samples.Context() with { Command = "dotnet /x/settinglint.dll" });
        Assert.Contains("  SL201  Instantaneous pickup is below the asymmetric locked-rotor current.  (dotnet /x/settinglint.dll rules show SL201)", text, StringComparison.Ordinal);
    }
}
