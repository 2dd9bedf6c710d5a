namespace SettingLint.Core.Model;

/// <summary>
/// Key paths to keep of documents (<see cref="BoundDocument.Restrict"/>), with every path on the way to them: worked out
/// once for a run, and then applied to each of its motors.
/// </summary>
public sealed class PathSelection
{
    public PathSelection(IEnumerable<string> paths)
    {
        ArgumentNullException.ThrowIfNull(paths);
        var kept = new HashSet<string>(paths, StringComparer.Ordinal);
        var onTheWay = new HashSet<string>(kept, StringComparer.Ordinal);
        foreach (var p in kept)
        {
            // Every prefix that SpanOf may fall back to: "a.b.c" gives "a.b" and "a".
            for (var dot = p.LastIndexOf('.'); dot >= 0; dot = dot == 0 ? -1 : p.LastIndexOf('.', dot - 1))
            {
                onTheWay.Add(p[..dot]);
            }
        }
        Paths = kept;
        OnTheWay = onTheWay;
    }

    /// <summary>The paths kept.</summary>
    public IReadOnlySet<string> Paths { get; }

    /// <summary>The paths kept and every path on the way to one of them.</summary>
    public IReadOnlySet<string> OnTheWay { get; }
}
