namespace SettingLint.Core.Documents;

/// <summary>
/// Many short strings (file paths, tags) kept as characters in shared blocks, each found by its number, and made into a
/// string only when asked. An entry costs its characters and 8 bytes; as a string it costs 22 bytes more, and its
/// reference. Ordinal order is the order of <see cref="string.CompareOrdinal(string, string)"/>. Adding is not
/// thread-safe; reading is, once adding is over.
/// </summary>
/// <remarks>
/// A run of 100,000 generated motors kept every motor's path and tag as strings from discovery to its end (about 11 MB,
/// with the GC's room above them): docs/performance.md, 2026-12-05, "Packed paths and tags".
/// </remarks>
internal sealed class PackedStrings
{
    // 32 KB blocks stay below the large object heap; a longer string is kept as a string of its own.
    private const int BlockChars = 16 * 1024;

    private readonly List<char[]> _blocks = [];
    private readonly List<string> _long = [];
    private int _used = BlockChars;

    // Each entry: its first character's place over all blocks in the high half (a long string's number, negated, less one),
    // its length in the low half.
    private long[] _entries;

    /// <param name="capacity">How many entries to make room for at first.</param>
    public PackedStrings(int capacity = 0) => _entries = capacity > 0 ? new long[capacity] : [];

    /// <summary>How many entries there are.</summary>
    public int Count { get; private set; }

    /// <summary>Adds an entry: <paramref name="first"/> followed by <paramref name="second"/>.</summary>
    /// <returns>Its number.</returns>
    public int Add(ReadOnlySpan<char> first, ReadOnlySpan<char> second = default)
    {
        var length = first.Length + second.Length;
        long place;
        if (length > BlockChars)
        {
            _long.Add(string.Concat(first, second));
            place = -_long.Count;
        }
        else
        {
            if (_used + length > BlockChars)
            {
                _blocks.Add(new char[BlockChars]);
                _used = 0;
            }
            var block = _blocks[^1];
            first.CopyTo(block.AsSpan(_used));
            second.CopyTo(block.AsSpan(_used + first.Length));
            place = ((long)(_blocks.Count - 1) * BlockChars) + _used;
            _used += length;
        }
        if (Count == _entries.Length) Array.Resize(ref _entries, Math.Max(16, _entries.Length * 2));
        _entries[Count] = (place << 32) | (uint)length;
        return Count++;
    }

    /// <summary>The characters of an entry.</summary>
    public ReadOnlySpan<char> this[int index]
    {
        get
        {
            ArgumentOutOfRangeException.ThrowIfGreaterThanOrEqual((uint)index, (uint)Count, nameof(index));
            var entry = _entries[index];
            var place = entry >> 32;
            var length = (int)(uint)entry;
            if (place < 0) return _long[(int)(-place) - 1];
            return _blocks[(int)(place / BlockChars)].AsSpan((int)(place % BlockChars), length);
        }
    }

    /// <summary>An entry as a string (a new one each time).</summary>
    public string GetString(int index) => new(this[index]);

    /// <summary>Ordinal comparison of two entries.</summary>
    public int Compare(int a, int b) => this[a].SequenceCompareTo(this[b]);

    /// <summary>Ordinal comparison of an entry with a string.</summary>
    public int Compare(int a, string b) => this[a].SequenceCompareTo(b);

    /// <summary>Gives back the room left over in the entries' array once adding is over.</summary>
    public void Trim()
    {
        if (_entries.Length > Count) Array.Resize(ref _entries, Count);
    }
}
