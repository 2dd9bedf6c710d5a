using SettingLint.Tests.Shared;
using SettingLint.Tests.Support;

namespace SettingLint.Cli.Tests;

/// <summary>
/// A real git repository in a temporary folder (made with <c>git init</c>), holding copies of the demo plant's
/// SG-41A bus, its motors P-201 (vacuum breaker) and P-301 (fused contactor, blocked above its rating) and the relay
/// model, with SL110 switched off so that it starts clean. Git runs without the user's own configuration.
/// </summary>
public sealed class GateGitRepo : IDisposable
{
    public const string Bus = "buses/sg-41a.yaml";
    public const string Breaker = "motors/p-201.yaml";
    public const string Contactor = "motors/p-301.yaml";
    public const string Model = "models/standard-motor-relay.yaml";
    public const string Config = ".settinglint.yaml";
    public const string CleanConfig = "# The CT saturation note is judged in the protection study.\nrules:\n  SL110: off\n";

    public GateGitRepo(bool demo = true)
    {
        Temp = new TempRepo(git: false);
        Git("init", "-q");
        if (!demo) return;
        var examples = Path.Combine(RepositoryPaths.Root(), "examples");
        foreach (var rel in (string[])[Bus, Breaker, Contactor, Model])
        {
            Temp.Write(rel, File.ReadAllText(Path.Combine(examples, rel)));
        }
        Temp.Write(Config, CleanConfig);
    }

    public TempRepo Temp { get; }

    public string Root => Temp.Root;

    public string PathOf(string rel) => Temp.PathOf(rel);

    public string Read(string rel) => File.ReadAllText(PathOf(rel));

    public void Write(string rel, string text) => Temp.Write(rel, text);

    /// <summary>Replaces text that must occur exactly once in a file.</summary>
    public void Edit(string rel, string old, string replacement) => Write(rel, Samples.Replace(Read(rel), old, replacement));

    /// <summary>Stages everything and commits.</summary>
    public void Commit(string message)
    {
        Git("add", "-A");
        Git("commit", "-q", "--no-verify", "-m", message);
    }

    /// <summary>Runs git in the repository and returns its output; throws when it fails.</summary>
    public string Git(params string[] args) => GitProcess.Checked(Root, args);

    /// <summary>Runs git with extra environment variables; returns the exit code and both streams.</summary>
    public (int Code, string Output, string Error) Run(string[] args, IReadOnlyDictionary<string, string>? environment = null) =>
        GitProcess.Run(Root, args, environment);

    /// <summary>`check ROOT --format json` and more, in-process.</summary>
    public CliRun CheckJson(params string[] more) => Cli.Run(["check", Root, "--format", "json", .. more]);

    public void Dispose() => Temp.Dispose();
}
