using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Gate;

namespace SettingLint.Core.Tests;

/// <summary>
/// SL011 on a folder's `.settinglint.yaml`: a change is judged against what the files above it already say, so that
/// loosening is found as in the root file and repeating the root's level is not taken for a change.
/// </summary>
public sealed class GateScopedChangesTests
{
    private const string Site = "site-a/.settinglint.yaml";

    // SL302 is a warning by default; every other rule an error.
    private static Level? DefaultLevel(string id) => id == "SL302" ? Level.Warning : Level.Error;

    /// <summary>The SL011 findings when <paramref name="file"/> goes from old to now, the other files staying as given.</summary>
    private static ImmutableArray<Finding> Compare(string file, string? old, string? now, params (string File, string Text)[] unchanged)
    {
        var contents = unchanged.ToDictionary(u => u.File, u => Encoding.UTF8.GetBytes(u.Text), StringComparer.Ordinal);
        if (now is not null) contents[file] = Encoding.UTF8.GetBytes(now);
        var set = ImmutableSortedSet.Create(StringComparer.Ordinal, file);
        var none = ImmutableSortedSet<string>.Empty.WithComparer(StringComparer.Ordinal);
        var oldContents = old is null ? ImmutableDictionary<string, byte[]>.Empty : ImmutableDictionary<string, byte[]>.Empty.Add(file, Encoding.UTF8.GetBytes(old));
        var changes = new ChangeSet("HEAD", "0123", false, now is null ? none : set, now is null ? set : none, null, oldContents);
        return GateChanges.Find("/r", changes, rel => contents.GetValueOrDefault(rel), ["builtin"], null, DefaultLevel, []);
    }

    private static (string Message, Level Level, int Line) Only(ImmutableArray<Finding> found)
    {
        var f = Assert.Single(found);
        Assert.Equal((EngineRules.GateChange, Site), (f.RuleId, f.File));
        return (f.Message, f.Level, f.Span.StartLine);
    }

    [Fact]
    public void Switching_a_rule_off_in_a_folder_is_a_warning_at_its_line()
    {
        Assert.Equal(("SL201 is switched off (it was error): it no longer reports anything.", Level.Warning, 3),
            Only(Compare(Site, null, "# Site A\nrules:\n  SL201: off\n")));
    }

    [Fact]
    public void Lowering_below_the_level_the_root_gives_is_found_against_the_roots_level()
    {
        Assert.Equal(("The severity of SL302 is lowered from error to note.", Level.Warning, 2),
            Only(Compare(Site, "rules:\n  SL302: error\n", "rules:\n  SL302: note\n", (".settinglint.yaml", "rules:\n  SL302: error\n"))));
    }

    [Fact]
    public void Repeating_the_roots_level_in_a_folder_changes_nothing_and_is_not_reported()
    {
        Assert.Empty(Compare(Site, null, "rules:\n  SL201: warning\n", (".settinglint.yaml", "rules:\n  SL201: warning\n")));
    }

    [Fact]
    public void Removing_a_folders_override_lowers_the_rule_to_the_level_of_the_root()
    {
        Assert.Equal(("The severity of SL201 is lowered from error to warning.", Level.Warning, 1),
            Only(Compare(Site, "rules:\n  SL201: error\n", "# Site A\n", (".settinglint.yaml", "rules:\n  SL201: warning\n"))));
    }

    [Fact]
    public void Deleting_a_folders_file_that_raised_a_rule_is_reported()
    {
        Assert.Equal(("The severity of SL302 is lowered from error to warning.", Level.Warning, 1),
            Only(Compare(Site, "rules:\n  SL302: error\n", null)));
    }

    [Fact]
    public void Turning_a_rule_on_in_a_folder_where_the_root_turned_it_off_is_not_reported()
    {
        Assert.Empty(Compare(Site, null, "rules:\n  SL201: on\n", (".settinglint.yaml", "rules:\n  SL201: off\n")));
    }

    // NFPA 70 430.32 is applied only under NFPA 70 (SL801): moving away from it, declared or implied, loosens the gate.
    [Theory]
    [InlineData("electrical_code: NFPA 70\n", "electrical_code: IEC 60364\n", "electrical_code is now IEC 60364 (it was NFPA 70): the rules of NFPA 70 (SL801) no longer run on some of the motors this file governs.", Level.Warning)]
    [InlineData("fail_on: error\n", "electrical_code: other\n", "electrical_code is now other (it was not declared): the rules of NFPA 70 (SL801) no longer run on some of the motors this file governs.", Level.Warning)]
    [InlineData("electrical_code: IEC 60364\n", "electrical_code: NFPA 70\n", "electrical_code is now NFPA 70 (it was IEC 60364): check which rules of the packs in use stop or start running.", Level.Note)]
    public void Changing_the_electrical_code_is_reported(string old, string now, string message, Level level)
    {
        Assert.Equal((message, level, 1), Only(Compare(Site, old, now)));
    }
}
