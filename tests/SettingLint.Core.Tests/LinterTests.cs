using System.Collections.Concurrent;
using System.Diagnostics;
using System.Text;
using SettingLint.Core.Findings;
using SettingLint.Core.Linting;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Core.Sources;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>The one entry point: paths against the request's working folder, the three file sources, observers.</summary>
public sealed class LinterTests
{
    private const string Motor = "motors/m-1.yaml";

    private static TempRepo Repo()
    {
        var repo = new TempRepo();
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write(Motor, Samples.Motor);
        return repo;
    }

    // Outside git and without a configuration, the root is the request's working folder when the checked file lies
    // below it (so `check motors/m-1.yaml` reaches ../buses/), never the process's current folder, which here is the
    // test's output folder inside this project's own git work tree.
    [Fact]
    public void Outside_git_the_root_is_the_request_s_working_folder_not_the_process_s()
    {
        using var repo = new TempRepo(git: false);
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write(Motor, Samples.Motor);
        Assert.Equal(repo.Root, Linter.FindRoot(repo.Root, Motor));
        var result = Linter.Check(new CheckRequest(repo.Root, [Motor]));
        Assert.Equal(repo.Root, result.RepositoryRoot);
        Assert.DoesNotContain(result.Findings, f => f.RuleId.StartsWith("SL0", StringComparison.Ordinal));
    }

    [Fact]
    public void Relative_paths_are_resolved_against_the_request_s_working_folder_not_the_process_s()
    {
        using var repo = Repo();
        // The process's current folder is the test's output folder, which holds no motor.
        Assert.NotEqual(repo.Root, Directory.GetCurrentDirectory());
        var result = Linter.Check(new CheckRequest(repo.PathOf("motors"), ["m-1.yaml"]));
        Assert.Equal(repo.Root, result.RepositoryRoot);
        Assert.Equal([Motor], result.CheckedFiles.ToArray());
        Assert.Empty(result.Notifications);
        Assert.Throws<ArgumentException>(() => Linter.Check(new CheckRequest("motors", ["m-1.yaml"])));
    }

    [Fact]
    public void An_unsaved_buffer_is_checked_instead_of_the_file_on_disk()
    {
        using var repo = Repo();
        var disk = Linter.Check(new CheckRequest(repo.Root, [Motor]));
        Assert.DoesNotContain(disk.Findings, f => f.RuleId == EngineRules.Syntax);
        // The buffer breaks line 3 (an unclosed flow mapping); the disk still holds the valid file.
        var buffer = Samples.MotorWith("tag: M-1\n", "tag: {M-1\n");
        var source = new OverlaySource(new DiskSource(repo.Root), new Dictionary<string, byte[]> { [Motor] = Encoding.UTF8.GetBytes(buffer) });
        var edited = Linter.Check(new CheckRequest(repo.Root, [Motor]) { Source = source });
        var syntax = Assert.Single(edited.Findings, f => f.RuleId == EngineRules.Syntax);
        Assert.Equal(Motor, syntax.File);
        Assert.Equal(Samples.Motor, File.ReadAllText(repo.PathOf(Motor)));
    }

    [Fact]
    public void A_buffer_not_saved_yet_is_found_under_its_folder_and_a_hidden_file_is_not()
    {
        using var repo = Repo();
        var added = "motors/m-2.yaml";
        var source = new OverlaySource(
            new DiskSource(repo.Root),
            new Dictionary<string, byte[]> { [added] = Encoding.UTF8.GetBytes(Samples.MotorWith("tag: M-1", "tag: M-2")) },
            [Motor]);
        var result = Linter.Check(new CheckRequest(repo.Root, ["motors"]) { Source = source });
        Assert.Equal([added], result.CheckedFiles.ToArray());
        Assert.Equal(["M-2"], result.Motors.ToArray());
    }

    [Fact]
    public void A_git_revision_is_read_from_git_without_a_copy()
    {
        using var repo = new TempRepo(git: false);
        repo.Write("buses/bus-1.yaml", Samples.Bus);
        repo.Write(Motor, Samples.Motor);
        Git(repo.Root, "init", "-q");
        Git(repo.Root, "add", "-A");
        Git(repo.Root, "-c", "user.name=Test", "-c", "user.email=test@example.invalid", "commit", "-q", "-m", "first");
        // After the commit: the motor is broken on disk and a second motor is added.
        repo.Write(Motor, Samples.MotorWith("tag: M-1\n", "tag: {M-1\n"));
        repo.Write("motors/m-2.yaml", Samples.MotorWith("tag: M-1", "tag: M-2"));

        var now = Linter.Check(new CheckRequest(repo.Root, ["motors"]));
        var then = Linter.Check(new CheckRequest(repo.Root, ["motors"]) { Source = GitRevisionSource.At(repo.Root, "HEAD") });

        Assert.Contains(now.Findings, f => f.RuleId == EngineRules.Syntax && f.File == Motor);
        Assert.Equal(["motors/m-1.yaml", "motors/m-2.yaml"], now.CheckedFiles.ToArray());
        Assert.DoesNotContain(then.Findings, f => f.RuleId == EngineRules.Syntax);
        Assert.Equal([Motor], then.CheckedFiles.ToArray());
        Assert.Equal(["M-1"], then.Motors.ToArray());
        // The motor's bus reference resolved at the revision too: no SL007.
        Assert.DoesNotContain(then.Findings, f => f.RuleId == EngineRules.Reference);
        Assert.Throws<Sources.GitException>(() => GitRevisionSource.At(repo.Root, "no-such-branch"));
    }

    [Fact]
    public void Observers_see_every_motor_and_every_outcome_of_the_one_run()
    {
        using var repo = Repo();
        var observer = new Counting();
        var listened = Linter.Check(new CheckRequest(repo.Root, []) { Observers = [observer] });
        var plain = Linter.Check(new CheckRequest(repo.Root, []));
        Assert.Equal(["M-1"], observer.Motors.Select(m => m.Tag));
        Assert.NotEmpty(observer.Outcomes);
        // Every finding of a rule is a failed outcome the observer saw, and listening changes no finding.
        foreach (var f in listened.Findings.Where(f => !f.RuleId.StartsWith("SL0", StringComparison.Ordinal)))
        {
            Assert.Contains(observer.Outcomes, o => o.RuleId == f.RuleId && !o.Passed);
        }
        Assert.Equal(plain.Findings.Select(f => (f.RuleId, f.File, f.Span, f.KeyPath)), listened.Findings.Select(f => (f.RuleId, f.File, f.Span, f.KeyPath)));
    }

    private sealed class Counting : ICheckObserver
    {
        public ConcurrentBag<MotorProtection> Motors { get; } = [];

        public ConcurrentBag<RuleOutcome> Outcomes { get; } = [];

        public void OnMotor(MotorProtection motor) => Motors.Add(motor);

        public void OnOutcome(RuleOutcome outcome) => Outcomes.Add(outcome);
    }

    private static void Git(string dir, params string[] args)
    {
        var start = new ProcessStartInfo("git") { WorkingDirectory = dir, RedirectStandardOutput = true, RedirectStandardError = true };
        foreach (var a in args) start.ArgumentList.Add(a);
        using var p = Process.Start(start)!;
        p.StandardOutput.ReadToEnd();
        var error = p.StandardError.ReadToEnd();
        p.WaitForExit();
        Assert.True(p.ExitCode == 0, "git " + string.Join(' ', args) + ": " + error);
    }
}
