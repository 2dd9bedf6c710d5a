using System.Text;

namespace SettingLint.Core.Documents;

/// <summary>
/// Many short strings (file paths, tags) kept in shared blocks, each found by its number and made into a string only when
/// asked. An ASCII string of up to 255 characters costs a byte per character and 5 bytes besides; as a string it costs two
/// bytes per character and 30 bytes besides (its header and reference). Any other string is kept as a string. Ordinal
/// order is the order of <see cref="string.CompareOrdinal(string, string)"/>. Adding is not thread-safe; reading is, once
/// adding is over.
/// </summary>
/// <remarks>
/// A run of 100,000 generated motors kept every motor's path and tag as strings from discovery to its end (about 11 MB,
/// with the GC's room above them): docs/performance.md, 2026-12-05, "Packed paths and tags".
/// </remarks>
internal sealed class PackedStrings
{
    // 32 KB blocks stay below the large object heap. An entry is a length byte and the characters as bytes.
    private const int BlockBytes = 32 * 1024;
    private const int MaxPacked = byte.MaxValue;

    private readonly List<byte[]> _blocks = [];
    private readonly List<string> _strings = [];
    private int _used = BlockBytes;

    // Each entry: the place of its length byte over all blocks; or, for a string kept as it is, its number negated, less one.
    private int[] _entries;

    /// <param name="capacity">How many entries to make room for at first.</param>
    public PackedStrings(int capacity = 0) => _entries = capacity > 0 ? new int[capacity] : [];

    /// <summary>How many entries there are.</summary>
    public int Count { get; private set; }

    /// <summary>Adds an entry: <paramref name="first"/> followed by <paramref name="second"/>.</summary>
    /// <returns>Its number.</returns>
    public int Add(ReadOnlySpan<char> first, ReadOnlySpan<char> second = default)
    {
        var length = first.Length + second.Length;
        int place;
        if (length > MaxPacked || !Ascii.IsValid(first) || !Ascii.IsValid(second))
        {
            _strings.Add(string.Concat(first, second));
            place = -_strings.Count;
        }
        else
        {
            var bytes = Room(length);
            Narrow(first, bytes);
            Narrow(second, bytes[first.Length..]);
            place = _used - length - 1 + ((_blocks.Count - 1) * BlockBytes);
        }
        return Enter(place);
    }

    /// <summary>Adds a copy of another's entry.</summary>
    /// <returns>Its number here.</returns>
    public int Add(PackedStrings other, int index)
    {
        ArgumentNullException.ThrowIfNull(other);
        var place = other.Place(index);
        if (place < 0)
        {
            _strings.Add(other._strings[-place - 1]);
            return Enter(-_strings.Count);
        }
        var bytes = other.Bytes(place);
        bytes.CopyTo(Room(bytes.Length));
        return Enter(_used - bytes.Length - 1 + ((_blocks.Count - 1) * BlockBytes));
    }

    /// <summary>An entry as a string (a new one each time, but for a string kept as it is).</summary>
    public string GetString(int index)
    {
        var place = Place(index);
        return place < 0 ? _strings[-place - 1] : Encoding.ASCII.GetString(Bytes(place));
    }

    /// <summary>Ordinal comparison of two entries.</summary>
    public int Compare(int a, int b)
    {
        int pa = Place(a), pb = Place(b);
        if (pa >= 0 && pb >= 0) return Bytes(pa).SequenceCompareTo(Bytes(pb));
        if (pa < 0 && pb < 0) return string.CompareOrdinal(_strings[-pa - 1], _strings[-pb - 1]);
        return pa >= 0 ? Compare(Bytes(pa), _strings[-pb - 1]) : -Compare(Bytes(pb), _strings[-pa - 1]);
    }

    /// <summary>Ordinal comparison of an entry with a string.</summary>
    public int Compare(int a, string b)
    {
        ArgumentNullException.ThrowIfNull(b);
        var place = Place(a);
        return place < 0 ? string.CompareOrdinal(_strings[-place - 1], b) : Compare(Bytes(place), b);
    }

    /// <summary>The numbers 0 to <paramref name="count"/> - 1 in the order <paramref name="compare"/> gives them (entries are sorted by their numbers, not moved).</summary>
    public static int[] Sorted(int count, Comparison<int> compare)
    {
        var order = new int[count];
        for (var i = 0; i < order.Length; i++) order[i] = i;
        Array.Sort(order, compare);
        return order;
    }

    /// <summary>Gives back the room left over in the entries' array once adding is over.</summary>
    public void Trim()
    {
        if (_entries.Length > Count) Array.Resize(ref _entries, Count);
    }

    // ASCII bytes against UTF-16 characters: the order of their code units.
    private static int Compare(ReadOnlySpan<byte> ascii, string text)
    {
        var n = Math.Min(ascii.Length, text.Length);
        for (var i = 0; i < n; i++)
        {
            if (ascii[i] != text[i]) return ascii[i] - text[i];
        }
        return ascii.Length - text.Length;
    }

    private static void Narrow(ReadOnlySpan<char> chars, Span<byte> bytes)
    {
        for (var i = 0; i < chars.Length; i++) bytes[i] = (byte)chars[i];
    }

    // Room for an entry of this many characters after its length byte, in the last block or a new one.
    private Span<byte> Room(int length)
    {
        if (_used + length + 1 > BlockBytes)
        {
            _blocks.Add(new byte[BlockBytes]);
            _used = 0;
        }
        var block = _blocks[^1];
        block[_used] = (byte)length;
        var room = block.AsSpan(_used + 1, length);
        _used += length + 1;
        return room;
    }

    private int Enter(int place)
    {
        if (Count == _entries.Length) Array.Resize(ref _entries, Math.Max(16, _entries.Length * 2));
        _entries[Count] = place;
        return Count++;
    }

    private int Place(int index)
    {
        ArgumentOutOfRangeException.ThrowIfGreaterThanOrEqual((uint)index, (uint)Count, nameof(index));
        return _entries[index];
    }

    private ReadOnlySpan<byte> Bytes(int place)
    {
        var block = _blocks[place / BlockBytes];
        var at = place % BlockBytes;
        return block.AsSpan(at + 1, block[at]);
    }
}
