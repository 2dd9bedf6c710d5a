using System.Collections.Immutable;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Model;
using SettingLint.Core.Rules;
using SettingLint.Reporting;

namespace SettingLint.Cli.Tests.Hardness;

/// <summary>Same input, same bytes: from another current folder, serial or parallel; a failing rule is reported, not fatal.</summary>
public sealed class DeterminismTests
{
    private static string Examples() => Path.Combine(RepositoryPaths.Root(), "examples");

    private static string Sarif(CheckResult result, string cwd)
    {
        var w = new StringWriter();
        new SarifReporter().Write(result, new ReportContext(cwd, false, false, ToolInfo.ForVersion("0.1.0")), w);
        return w.ToString();
    }

    [Fact]
    public void Sarif_is_byte_identical_twice_and_from_another_current_folder()
    {
        var first = Sarif(Session.Open([Examples()]).Check([Examples()], null), RepositoryPaths.Root());
        var second = Sarif(Session.Open([Examples()]).Check([Examples()], null), RepositoryPaths.Root());
        var elsewhere = Sarif(Session.Open([Examples()]).Check([Examples()], null), Path.GetTempPath());
        Assert.Equal(first, second);
        Assert.Equal(first, elsewhere);
        Assert.Contains("\"SL102\"", first, StringComparison.Ordinal);
    }

    // The order of parallel, serial and reversed work is compared in SettingLint.Core.Tests/OrderTests, against an order
    // written in the test (comparing two results the checker had already sorted could not fail).

    /// <summary>A rule set whose evaluation throws on one motor, after the real rules have run.</summary>
    private sealed class ThrowingRules(IRuleSet inner, string victimTag) : IRuleSet
    {
        public ImmutableArray<RuleDescriptor> Descriptors => inner.Descriptors;

        public void Evaluate(MotorProtection motor, RepositoryIndex index, FindingBuilder findings, Action<Notification> notify)
        {
            inner.Evaluate(motor, index, findings, notify);
            if (motor.Tag == victimTag) throw new InvalidOperationException("simulated rule failure");
        }
    }

    [Fact]
    public void A_rule_that_throws_is_an_internal_notification_and_exit_3_while_other_findings_stay()
    {
        var session = Session.Open([Examples()]);
        var result = new Checker(new ThrowingRules(session.Rules, "P-503")).Run(new CheckOptions([Examples()]));
        var internalError = Assert.Single(result.Notifications, n => n.Kind == NotificationKind.Internal);
        Assert.Contains("simulated rule failure", internalError.Message, StringComparison.Ordinal);
        Assert.Equal("examples/motors/p-503.yaml", internalError.File);
        Assert.Equal(ExitCodes.Internal, result.ExitCode);
        // The other motors' findings are all still there.
        Assert.Contains(result.Findings, f => f.RuleId == "SL102" && f.File == "examples/motors/p-202.yaml");
        Assert.Contains(result.Findings, f => f.RuleId == "SL302" && f.File == "examples/motors/b-401.yaml");
        // And SARIF says the run did not succeed, with a tool execution notification.
        var sarif = Sarif(result, RepositoryPaths.Root());
        Assert.Contains("\"executionSuccessful\": false", sarif, StringComparison.Ordinal);
        Assert.Contains("toolExecutionNotifications", sarif, StringComparison.Ordinal);
    }
}
