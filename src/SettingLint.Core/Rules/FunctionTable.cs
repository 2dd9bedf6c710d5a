using System.Text;

namespace SettingLint.Core.Rules;

/// <summary>The function table of docs/rule-language.md, written from the definitions so that the two cannot differ.</summary>
public static class FunctionTable
{
    /// <summary>The markdown table of a function table, in its order (`settinglint rules functions`).</summary>
    public static string Render(IEnumerable<FunctionDef> functions)
    {
        var sb = new StringBuilder();
        sb.Append("| function | result | meaning | defined for |\n");
        sb.Append("|---|---|---|---|\n");
        foreach (var f in functions)
        {
            sb.Append("| `").Append(f.Signature).Append("` | ").Append(f.Result).Append(" | ").Append(f.Meaning)
                .Append(f.OverOtherMotors ? " (reads the other motors on the bus)" : "")
                .Append(" | ").Append(DefinedFor(f)).Append(" |\n");
        }
        return sb.ToString();
    }

    /// <summary>The built-in table.</summary>
    public static string Render() => Render(Functions.Ordered);

    // The arguments' domains as a person reads them: "pickup > 0, tau > 0" (outside them the result is absent).
    private static string DefinedFor(FunctionDef f)
    {
        var names = f.ArgumentNames;
        var parts = new List<string>();
        for (var i = 0; i < f.Domain.Length && i < names.Count; i++)
        {
            var condition = f.Domain[i] switch
            {
                ArgDomain.Finite => " finite",
                ArgDomain.NonNegative => " >= 0",
                ArgDomain.Positive => " > 0",
                _ => null,
            };
            if (condition is not null) parts.Add("`" + names[i] + "`" + condition);
        }
        return parts.Count == 0 ? "all values" : string.Join(", ", parts);
    }
}
