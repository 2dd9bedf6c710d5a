using System.Text.Json;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>One in-process run of the command line: exit code and both streams.</summary>
public sealed record CliRun(int Exit, string Stdout, string Stderr)
{
    /// <summary>The JSON report on standard output (for runs with --format json).</summary>
    public JsonElement Json => JsonDocument.Parse(Stdout).RootElement;

    /// <summary>(rule id, file, line, column) of every finding in the JSON report, in report order.</summary>
    public (string Rule, string File, int Line, int Column)[] Findings =>
        [.. Json.GetProperty("findings").EnumerateArray().Select(f => (
            f.GetProperty("ruleId").GetString()!,
            f.GetProperty("file").GetString()!,
            f.GetProperty("line").GetInt32(),
            f.GetProperty("column").GetInt32()))];

    /// <summary>(rule id, line, column) of the findings of one file.</summary>
    public (string Rule, int Line, int Column)[] In(string file) =>
        [.. Findings.Where(f => f.File == file).Select(f => (f.Rule, f.Line, f.Column))];

    /// <summary>Level tokens by rule id, from the JSON report.</summary>
    public (string Rule, string Level)[] Levels =>
        [.. Json.GetProperty("findings").EnumerateArray().Select(f => (f.GetProperty("ruleId").GetString()!, f.GetProperty("level").GetString()!))];

    /// <summary>For assertion messages.</summary>
    public override string ToString() => "exit " + Exit + "\n--- stdout\n" + Stdout + "\n--- stderr\n" + Stderr;
}

/// <summary>Runs <see cref="CliApp.Run"/> in-process and writes repositories for it.</summary>
public static class Cli
{
    /// <summary>A configuration that runs no rule pack: only the engine's SL0xx checks, so goldens do not move with the rules.</summary>
    public const string EngineOnlyConfig = "packs: []\n";

    public static CliRun Run(params string[] args)
    {
        using var stdout = new StringWriter();
        using var stderr = new StringWriter();
        var exit = CliApp.Run(args, stdout, stderr);
        return new CliRun(exit, stdout.ToString(), stderr.ToString());
    }

    /// <summary>`check ROOT --format json` plus any further arguments.</summary>
    public static CliRun CheckJson(TempRepo repo, params string[] more) => Run(["check", repo.Root, "--format", "json", .. more]);

    /// <summary>A repository with the sample bus and motor, engine-only unless told otherwise.</summary>
    public static TempRepo Repo(string? motor = null, string? bus = null, bool engineOnly = true)
    {
        var repo = new TempRepo();
        Samples.WriteMinimal(repo, motor, bus);
        if (engineOnly) repo.Write(".settinglint.yaml", EngineOnlyConfig);
        return repo;
    }
}
