using SettingLint.Core.Rules;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests.Rules;

/// <summary>
/// Pins the function table's own description against the reference people read: the table in docs/rule-language.md
/// ("Functions") is the one the definitions print (signature, result, meaning, the values each is defined for), and the
/// flags the compiler reads and the table does not show (a path argument, percent display) are the ones that
/// reference describes. A definition that drifts from the docs fails here, in Core, and not only in the CLI's run.
/// </summary>
public sealed class FunctionReferenceTableTests
{
    private static string DocsTable()
    {
        var doc = File.ReadAllText(Path.Combine(RepositoryPaths.Root(), "docs", "rule-language.md")).ReplaceLineEndings("\n");
        var start = doc.IndexOf("| function | result | meaning | defined for |", StringComparison.Ordinal);
        Assert.True(start >= 0, "docs/rule-language.md has no function table; print it with `settinglint rules functions`.");
        var end = doc.IndexOf("\n\n", start, StringComparison.Ordinal);
        return doc[start..(end + 1)];
    }

    private static string[] Rows(string table) => table.Split('\n', StringSplitOptions.RemoveEmptyEntries)[2..];

    // docs/rule-language.md, "Functions": the whole table, row by row (a row-wise comparison names the function that differs).
    [Fact]
    public void Each_row_of_the_docs_table_is_the_one_its_definition_prints()
    {
        var docs = Rows(DocsTable());
        var printed = Rows(FunctionTable.Render());
        Assert.Equal(Functions.Ordered.Count, printed.Length);
        Assert.Equal(docs.Length, printed.Length);
        for (var i = 0; i < docs.Length; i++) Assert.Equal(docs[i], printed[i]);
        Assert.Equal(DocsTable(), FunctionTable.Render());
    }

    // The table's order is the docs' order, and each row starts with the function's own name: the name a rule calls
    // is the one the reference documents.
    [Fact]
    public void Each_row_names_its_function()
    {
        var rows = Rows(DocsTable());
        Assert.Equal(Functions.Ordered.Count, rows.Length);
        for (var i = 0; i < rows.Length; i++)
        {
            var f = Functions.Ordered[i];
            Assert.StartsWith("| `" + f.Name + "(", rows[i], StringComparison.Ordinal);
            Assert.Same(f, Functions.All[f.Name]);
        }
    }

    // docs/rule-language.md: `present(path)` "takes a path, not an expression"; it is the only one.
    [Fact]
    public void Only_present_takes_a_path()
    {
        Assert.Equal(["present"], Functions.Ordered.Where(f => f.TakesPath).Select(f => f.Name));
    }

    // docs/rule-language.md: the functions "(reads the other motors on the bus)" are exactly the others_ functions.
    [Fact]
    public void Only_the_others_functions_read_the_bus()
    {
        Assert.Equal(["others_max", "others_min", "others_count"], Functions.Ordered.Where(f => f.OverOtherMotors).Select(f => f.Name));
    }

    // PercentRule (FunctionDef.Percent): a result is shown in percent when it is one of its arguments' values (min, max,
    // abs, coalesce, others_max/min) and the first is, and always for the shares (coverage of a winding, the hot level,
    // written as the full-load level is: 55 %).
    [Fact]
    public void Percent_display_follows_the_reference()
    {
        Assert.Equal(["min", "max", "abs", "coalesce", "others_max", "others_min"],
            Functions.Ordered.Where(f => f.Percent == PercentRule.AsFirstArgument).Select(f => f.Name));
        Assert.Equal(["hot_level", "coverage"], Functions.Ordered.Where(f => f.Percent == PercentRule.Always).Select(f => f.Name));
    }

    // The argument names of each signature are the names the "defined for" column uses (thermal_trip: pickup > 0 and
    // tau > 0, IEC 60255-149 needs both).
    [Fact]
    public void Argument_names_come_from_the_signature()
    {
        Assert.Equal(["current", "pickup", "tau", "start_level"], Functions.All["thermal_trip"].ArgumentNames);
        Assert.Equal(["flc", "pickup", "full_load_level"], Functions.All["hot_level"].ArgumentNames);
        Assert.Empty(Functions.All["others_count"].ArgumentNames);
    }
}
