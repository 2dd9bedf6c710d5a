namespace SettingLint.Core.Documents;

/// <summary>"Did you mean": the closest known key by edit distance, when it is close enough to be a typo.</summary>
public static class Suggestions
{
    /// <summary>The nearest candidate to a word, or null when none is within a third of its length (at least 2 edits).</summary>
    public static string? Nearest(string word, IEnumerable<string> candidates)
    {
        string? best = null;
        var bestDistance = int.MaxValue;
        foreach (var c in candidates.OrderBy(c => c, StringComparer.Ordinal))
        {
            var d = Distance(word.ToLowerInvariant(), c.ToLowerInvariant());
            if (d < bestDistance) { bestDistance = d; best = c; }
        }
        var allowed = Math.Max(2, word.Length / 3);
        return bestDistance <= allowed ? best : null;
    }

    /// <summary>Optimal string alignment distance (Levenshtein with adjacent transpositions).</summary>
    public static int Distance(string a, string b)
    {
        var d = new int[a.Length + 1, b.Length + 1];
        for (var i = 0; i <= a.Length; i++) d[i, 0] = i;
        for (var j = 0; j <= b.Length; j++) d[0, j] = j;
        for (var i = 1; i <= a.Length; i++)
        {
            for (var j = 1; j <= b.Length; j++)
            {
                var cost = a[i - 1] == b[j - 1] ? 0 : 1;
                d[i, j] = Math.Min(Math.Min(d[i - 1, j] + 1, d[i, j - 1] + 1), d[i - 1, j - 1] + cost);
                if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1])
                {
                    d[i, j] = Math.Min(d[i, j], d[i - 2, j - 2] + 1);
                }
            }
        }
        return d[a.Length, b.Length];
    }
}
