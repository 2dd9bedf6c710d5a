using System.Collections.Immutable;

namespace SettingLint.Reporting;

/// <summary>The output formats by name; adding a format is one entry in <see cref="Table"/>.</summary>
public static class Reporters
{
    // Factories, not instances: only the chosen format's reporter is made, a new one for each call.
    private static readonly ImmutableArray<(string Name, Func<IReporter> Create)> Table =
    [
        ("text", static () => new TextReporter()),
        ("json", static () => new JsonReporter()),
        ("sarif", static () => new SarifReporter()),
        ("markdown", static () => new MarkdownReporter()),
        ("code-quality", static () => new CodeQualityReporter()),
        ("junit", static () => new JUnitReporter()),
    ];

    /// <summary>The format names, in the order they are documented; "text" is the default.</summary>
    public static ImmutableArray<string> Formats { get; } = [.. Table.Select(static entry => entry.Name)];

    /// <summary>The reporter of a format (case-sensitive, as on the command line).</summary>
    /// <exception cref="ArgumentException">The format is not one of <see cref="Formats"/>.</exception>
    public static IReporter For(string format)
    {
        ArgumentNullException.ThrowIfNull(format);
        foreach (var (name, create) in Table)
        {
            if (string.Equals(name, format, StringComparison.Ordinal)) return create();
        }
        throw new ArgumentException(
            $"Unknown report format '{format}'; expected one of: {string.Join(", ", Formats)}.", nameof(format));
    }
}
