using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests;

/// <summary>
/// Common practice for CI tools: the same input gives the same output whatever order the work was done in. The
/// checker's work is run forward, in reverse and in parallel on the demo plant; the three results must be equal and
/// sorted by an order written here, independent of the checker's own comparer.
/// </summary>
public sealed class OrderTests
{
    private static string Examples() => Path.Combine(RepositoryPaths.Root(), "examples");

    private static CheckResult Run(bool parallel, bool reversed)
    {
        var examples = Examples();
        var session = Session.Open([examples]);
        return new Checker(session.Rules) { Reversed = reversed }
            .Run(new CheckOptions([examples], Parallel: parallel, Include: session.Config.Includes, Root: session.Root));
    }

    private static List<string> Keys(CheckResult r) => [.. r.Findings.Select(f => $"{f.File}:{f.Span.StartLine}:{f.Span.StartColumn} {f.RuleId} {f.KeyPath} {f.Message}")];

    [Fact]
    public void Forward_reversed_and_parallel_work_give_one_sorted_output()
    {
        var forward = Run(parallel: false, reversed: false);
        var reversed = Run(parallel: false, reversed: true);
        var parallel = Run(parallel: true, reversed: false);
        // The demo has planted mistakes in several files, so that an order of work could show in the output.
        Assert.True(forward.Findings.Select(f => f.File).Distinct().Count() > 1, "findings in more than one file");
        Assert.Equal(Keys(forward), Keys(reversed));
        Assert.Equal(Keys(forward), Keys(parallel));
        Assert.Equal(forward.Motors.ToArray(), reversed.Motors.ToArray());
        // Sorted by file (ordinal), line, column and rule: checked here, not by Finding.Order.
        var oracle = forward.Findings
            .OrderBy(f => f.File, StringComparer.Ordinal).ThenBy(f => f.Span.StartLine).ThenBy(f => f.Span.StartColumn)
            .ThenBy(f => f.RuleId, StringComparer.Ordinal).ThenBy(f => f.KeyPath, StringComparer.Ordinal).ThenBy(f => f.Message, StringComparer.Ordinal)
            .ToList();
        Assert.Equal(oracle.Select(f => f.Fingerprint + f.Span), forward.Findings.Select(f => f.Fingerprint + f.Span));
        // The reversed run did its work in another order: the first motor bound is not the same (else this test proves nothing).
        var firstForward = new List<string>();
        var firstReversed = new List<string>();
        new Checker(Session.Open([Examples()]).Rules) { OnLoaded = f => firstForward.Add(f.RelativePath) }.Run(new CheckOptions([Examples()], Parallel: false));
        new Checker(Session.Open([Examples()]).Rules) { OnLoaded = f => firstReversed.Add(f.RelativePath), Reversed = true }.Run(new CheckOptions([Examples()], Parallel: false));
        Assert.NotEqual(firstForward[0], firstReversed[0]);
    }
}
