using System.CommandLine;
using SettingLint.Cli.Server;

namespace SettingLint.Cli;

/// <summary>`settinglint server`: the Language Server Protocol over standard input and output.</summary>
public static class ServerCommand
{
    public static Command Create(TextWriter stderr)
    {
        var stdio = new Option<bool>("--stdio") { Description = "Talk over standard input and output (the default and only transport; accepted because editors pass it)." };
        var command = new Command("server", "Run the language server (LSP over standard input and output): findings as you type, and hovers with values, margins and setting windows.")
        {
            stdio,
        };
        command.SetAction(_ =>
        {
            // Standard output carries the protocol only: anything else written there would corrupt it.
            using var input = Console.OpenStandardInput();
            using var output = Console.OpenStandardOutput();
            return LanguageServerHost.RunAsync(input, output, ServerOptions.Default, stderr).GetAwaiter().GetResult();
        });
        return command;
    }
}
