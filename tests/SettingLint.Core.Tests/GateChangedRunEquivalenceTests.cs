using SettingLint.Core.Findings;
using SettingLint.Core.Gate;
using SettingLint.Core.Linting;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>
/// A changed-files run reports, for the files it checks, exactly what a run over every file reports for them: the
/// quick read and the load plan leave a file unread only where nothing in it can change a reported finding. The plant
/// writes its references in the ways the quick read must place right or leave to the loader.
/// </summary>
public sealed class GateChangedRunEquivalenceTests
{
    // GatePlant: TST102 over the bus (a motor's hot stall time, 10 s in the sample, against the longest start of the
    // other motors on its bus) fires on m-1 because m-2 starts for 30 s. The motors added here start for longer, so
    // that a bus mate left unread changes the limit TST102 names.
    private static GitWorkTree Plant()
    {
        var git = GatePlant.Create();
        // On bus-1 from another folder, by another spelling, quoted, with a comment.
        git.Write("motors/sub/m-4.yaml", Motor("M-4", "bus: \"../../buses/./bus-1.yaml\"  # the same bus", "40 s"));
        // On bus-1 with the value on the next line: a plain scalar, not an inline bus.
        git.Write("motors/m-5.yaml", Motor("M-5", "bus:\n  ../buses/bus-1.yaml", "50 s"));
        // Its kind on the next line, on bus-1.
        git.Write("motors/m-6.yaml", Motor("M-6", "bus: ../buses/bus-1.yaml", "60 s").Replace("kind: motor-protection", "kind:\n  motor-protection", StringComparison.Ordinal));
        // The tag of m-1 again, on bus-2: the tag rule reports it on the later file, naming m-1.
        git.Write("motors/m-7.yaml", Motor("M-1", "bus: ../buses/bus-2.yaml", "4.5 s"));
        // A plain value that goes on over the next line: "../buses/ bus-2.yaml", no file.
        git.Write("motors/m-8.yaml", Motor("M-8", "bus: ../buses/\n  bus-2.yaml", "4.5 s"));
        // An anchor: the quick read leaves it to the loader. It has m-2's tag: when bus-2 changes it is checked, and the
        // tag rule needs m-2, on bus-1, which nothing the quick read was sure of leads to.
        git.Write("motors/m-9.yaml", Motor("M-2", "bus: &b ../buses/bus-2.yaml", "70 s"));
        // An inline bus: the motor's own.
        git.Write("motors/m-10.yaml", Motor("M-10", "bus:\n  " + Samples.Bus.TrimEnd().Replace("\n", "\n  ", StringComparison.Ordinal), "4.5 s"));
        git.Commit("more motors");
        return git;
    }

    private static string Motor(string tag, string busLine, string start) =>
        Samples.Replace(Samples.Replace(Samples.MotorWith("tag: M-1", "tag: " + tag), "bus: ../buses/bus-1.yaml", busLine), "acceleration_time: 4.5 s", "acceleration_time: " + start);

    private static CheckResult Run(GitWorkTree git, GateOptions options) =>
        Linter.Check(new CheckRequest(git.Root, [git.Root]) { Options = options, Parallel = false });

    private static (string, string, int, string, string)[] Seen(IEnumerable<Finding> findings) =>
        [.. findings.Select(f => (f.RuleId, f.File, f.Span.StartLine, f.KeyPath, f.Message))];

    public static TheoryData<string> Files => new()
    {
        GatePlant.M1, GatePlant.M2, GatePlant.M3, "motors/sub/m-4.yaml", "motors/m-5.yaml", "motors/m-6.yaml", "motors/m-7.yaml",
        "motors/m-8.yaml", "motors/m-9.yaml", "motors/m-10.yaml", "buses/bus-1.yaml", "buses/bus-2.yaml",
    };

    [Theory]
    [MemberData(nameof(Files))]
    public void An_edited_file_is_reported_as_the_full_run_reports_it_with_its_dependants(string file)
    {
        using var git = Plant();
        var full = Run(git, new GateOptions());
        Assert.Empty(full.Notifications);
        // The plant is meant to exercise the bus rule and the tag rule; a full run shows they fire.
        Assert.Contains(full.Findings, f => f.RuleId == "TST102" && f.File == "motors/m-5.yaml");
        Assert.Contains(full.Findings, f => f.File == "motors/m-7.yaml" && f.Message.Contains(GatePlant.M1, StringComparison.Ordinal));
        Assert.Contains(full.Findings, f => f.File == "motors/m-9.yaml" && f.Message.Contains(GatePlant.M2, StringComparison.Ordinal));

        git.Write(file, git.Read(file) + "# edited\n");
        var changed = Run(git, new GateOptions(ChangedSince: "HEAD"));
        Assert.Empty(changed.Notifications);
        Assert.Contains(file, changed.CheckedFiles);
        Assert.Equal(Seen(full.Findings.Where(f => changed.CheckedFiles.Contains(f.File))), Seen(changed.Findings));
    }

    [Theory]
    [InlineData("motors/m-5.yaml")]
    [InlineData("motors/sub/m-4.yaml")]
    [InlineData("motors/m-7.yaml")]
    public void A_deleted_motor_re_checks_what_the_full_run_without_it_reports(string file)
    {
        using var git = Plant();
        File.Delete(git.Temp.PathOf(file));
        var full = Run(git, new GateOptions());
        var changed = Run(git, new GateOptions(ChangedSince: "HEAD"));
        Assert.Empty(changed.Notifications);
        Assert.NotEmpty(changed.CheckedFiles);
        Assert.Equal(Seen(full.Findings.Where(f => changed.CheckedFiles.Contains(f.File))), Seen(changed.Findings));
    }
}
