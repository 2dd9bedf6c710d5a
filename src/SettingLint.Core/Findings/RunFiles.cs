using System.Collections.Immutable;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Findings;

/// <summary>
/// The setting files a run checked, sorted by root-relative path (ordinal), and the motors among them with their names and
/// buses. Paths and names are kept packed and made into strings when asked: each call that returns a string or a list
/// makes it anew.
/// </summary>
/// <remarks>
/// As arrays of strings (a path of 64 bytes and a tag of 40 for each motor, four arrays of 100,000 entries) they were most
/// of what a check of 100,000 generated motors held while its suggestions were worked out: docs/performance.md,
/// 2026-12-05, "Packed paths and tags".
/// </remarks>
public sealed class RunFiles
{
    private readonly PackedStrings _text;
    private readonly int[] _files;
    private readonly int[] _motorFile;
    private readonly int[] _motorName;
    private readonly int[] _motorBus;
    private readonly string[] _buses;

    /// <param name="text">The packed paths and names.</param>
    /// <param name="files">Each file's path in <paramref name="text"/>, sorted by path.</param>
    /// <param name="motorFile">Each motor's place in <paramref name="files"/>, ascending.</param>
    /// <param name="motorName">Each motor's name in <paramref name="text"/>.</param>
    /// <param name="motorBus">Each motor's bus, a place in <paramref name="buses"/>; -1 for none.</param>
    /// <param name="buses">The bus files, root-relative.</param>
    internal RunFiles(PackedStrings text, int[] files, int[] motorFile, int[] motorName, int[] motorBus, string[] buses)
    {
        (_text, _files, _motorFile, _motorName, _motorBus, _buses) = (text, files, motorFile, motorName, motorBus, buses);
    }

    /// <summary>No files.</summary>
    public static RunFiles Empty { get; } = new(new PackedStrings(), [], [], [], [], []);

    /// <summary>Files and motors given as strings (a front end's own result, a test).</summary>
    /// <param name="files">The files checked, in any order; a motor's file is added when missing.</param>
    /// <param name="motors">The motors: file, name (its tag, else its file name) and bus file (null for an inline bus or none).</param>
    public static RunFiles Of(IEnumerable<string> files, IEnumerable<(string File, string Name, string? Bus)>? motors = null)
    {
        ArgumentNullException.ThrowIfNull(files);
        var byFile = (motors ?? []).ToDictionary(m => m.File, StringComparer.Ordinal);
        var all = files.Concat(byFile.Keys).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList();
        var text = new PackedStrings();
        var busNumbers = new Dictionary<string, int>(StringComparer.Ordinal);
        List<int> motorFile = [], motorName = [], motorBus = [];
        var fileEntries = new int[all.Count];
        for (var i = 0; i < all.Count; i++)
        {
            fileEntries[i] = text.Add(all[i]);
            if (!byFile.TryGetValue(all[i], out var m)) continue;
            motorFile.Add(i);
            motorName.Add(text.Add(m.Name));
            motorBus.Add(m.Bus is null ? -1 : busNumbers.TryGetValue(m.Bus, out var b) ? b : busNumbers[m.Bus] = busNumbers.Count);
        }
        return new RunFiles(text, fileEntries, [.. motorFile], [.. motorName], [.. motorBus], [.. busNumbers.OrderBy(b => b.Value).Select(b => b.Key)]);
    }

    /// <summary>How many files.</summary>
    public int Count => _files.Length;

    /// <summary>How many of them are motors.</summary>
    public int MotorCount => _motorFile.Length;

    /// <summary>A file's root-relative path, by its place in path order.</summary>
    public string File(int index) => _text.GetString(_files[index]);

    /// <summary>A motor's file, by its place among the motors (in path order).</summary>
    public string MotorFile(int motor) => File(_motorFile[motor]);

    /// <summary>A motor's name: its tag, else its file name.</summary>
    public string MotorName(int motor) => _text.GetString(_motorName[motor]);

    /// <summary>A motor's bus file, root-relative; null for an inline bus or none.</summary>
    public string? MotorBus(int motor) => _motorBus[motor] < 0 ? null : _buses[_motorBus[motor]];

    /// <summary>Whether a root-relative path is one of the files.</summary>
    public bool Contains(string file) => IndexOf(file) >= 0;

    /// <summary>A file's place in path order; negative when it is not one of them.</summary>
    public int IndexOf(string file)
    {
        ArgumentNullException.ThrowIfNull(file);
        int lo = 0, hi = _files.Length - 1;
        while (lo <= hi)
        {
            var mid = lo + ((hi - lo) >> 1);
            var c = _text.Compare(_files[mid], file);
            if (c == 0) return mid;
            if (c < 0) lo = mid + 1;
            else hi = mid - 1;
        }
        return ~lo;
    }

    /// <summary>A motor's place among the motors, by its file; negative when the file is not a motor's.</summary>
    public int MotorIndexOf(string file)
    {
        var at = IndexOf(file);
        return at < 0 ? -1 : Math.Max(-1, Array.BinarySearch(_motorFile, at));
    }

    /// <summary>The files' paths, in path order.</summary>
    public ImmutableArray<string> Files()
    {
        var files = new string[_files.Length];
        for (var i = 0; i < files.Length; i++) files[i] = File(i);
        return [.. files];
    }

    /// <summary>The motors' names, sorted (ordinal).</summary>
    public ImmutableArray<string> MotorNames()
    {
        var names = new string[_motorName.Length];
        for (var i = 0; i < names.Length; i++) names[i] = MotorName(i);
        Array.Sort(names, StringComparer.Ordinal);
        return [.. names];
    }
}
