using SettingLint.Core.Rules;
using SettingLint.Core.Validation;

namespace SettingLint.Tests.Support;

/// <summary>The built-in rule pack as a test runs it: loaded without a problem, all of it or the rules chosen.</summary>
public static class BuiltInRules
{
    /// <summary>The built-in rules (those <paramref name="chosen"/> keeps), compiled into one rule set.</summary>
    public static RuleSet Load(Func<CompiledRule, bool>? chosen = null)
    {
        var loaded = new RuleLoader(SchemaSet.Shared).Load(RuleLoader.BuiltIn());
        Assert.Empty(loaded.Problems);
        return new RuleSet([.. loaded.Rules.Where(chosen ?? (_ => true))]);
    }
}
