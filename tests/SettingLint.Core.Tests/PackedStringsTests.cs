using CsCheck;
using SettingLint.Core.Discovery;
using SettingLint.Core.Documents;
using SettingLint.Tests.Shared;

namespace SettingLint.Core.Tests;

/// <summary>Paths and tags kept packed give back what was put in, in the order strings sort (ordinal).</summary>
public sealed class PackedStringsTests
{
    [Fact]
    public void Entries_come_back_whole_across_blocks_and_longer_than_a_block()
    {
        var packed = new PackedStrings();
        var written = new List<string>();
        // 5,000 entries of 1-40 characters fill several 32 KB blocks; one of 20,000 characters is kept as a string.
        for (var i = 0; i < 5_000; i++) written.Add(new string((char)('a' + (i % 26)), 1 + (i % 40)) + i);
        written.Insert(2_500, new string('x', 20_000));
        var numbers = written.Select(w => packed.Add(w)).ToList();

        Assert.Equal(Enumerable.Range(0, written.Count), numbers);
        Assert.Equal(written, numbers.Select(packed.GetString));
        Assert.Equal(20_000, packed.GetString(2_500).Length);
    }

    [Fact]
    public void An_entry_copied_from_another_comes_back_the_same()
    {
        var from = new PackedStrings();
        string[] words = ["motors/p-1.yaml", "tag \u00e9", new string('y', 300)];
        foreach (var w in words) from.Add(w);
        var to = new PackedStrings();
        to.Add("first");
        Assert.Equal(words, Enumerable.Range(0, words.Length).Select(i => to.GetString(to.Add(from, i))));
    }

    [Fact]
    public void Two_parts_make_one_entry()
    {
        var packed = new PackedStrings();
        var n = packed.Add("motors/", "p-1.yaml");
        Assert.Equal("motors/p-1.yaml", packed.GetString(n));
        Assert.Equal("", packed.GetString(packed.Add("")));
    }

    [Fact]
    public void Entries_compare_as_ordinal_strings_do()
    {
        // U+FF21 (fullwidth A) sorts after a surrogate pair in UTF-16 order (0xD83D < 0xFF21), though its code point is lower:
        // the order of string.CompareOrdinal, which the output's order is, not that of code points or of UTF-8 bytes.
        string[] words = ["b", "a", "\uFF21", "\U0001F600", "ab", "", "B", "a/b", "a-b", "a\u00e9", "a\u007f", new string('a', 300), new string('a', 255)];
        var packed = new PackedStrings();
        foreach (var w in words) packed.Add(w);
        for (var i = 0; i < words.Length; i++)
        {
            for (var j = 0; j < words.Length; j++)
            {
                Assert.Equal(Math.Sign(string.CompareOrdinal(words[i], words[j])), Math.Sign(packed.Compare(i, j)));
                Assert.Equal(Math.Sign(string.CompareOrdinal(words[i], words[j])), Math.Sign(packed.Compare(i, words[j])));
            }
        }
    }

    // Characters from the ranges whose order differs between code points and UTF-16 code units, ASCII most often.
    private static readonly Gen<string> Words = Gen.Frequency(
        (6, Gen.Char['-', 'z']),
        (1, Gen.Char['\u0080', '\u00ff']),
        (1, Gen.Char['\ue000', '\uffff']),
        (1, Gen.Char['\ud800', '\udfff'])).Array[0, 12].Select(c => new string(c));

    [Fact]
    public void Random_entries_sort_as_ordinal_strings_do_and_come_back_whole()
    {
        // Fixed seeds (SeededSample): the same lists in every run.
        Words.Array[1, 40].SampleSeeded(words =>
        {
            var packed = new PackedStrings();
            foreach (var w in words) packed.Add(w);
            Assert.Equal(words, Enumerable.Range(0, words.Length).Select(packed.GetString));
            var byPacked = Enumerable.Range(0, words.Length).ToArray();
            Array.Sort(byPacked, (a, b) => packed.Compare(a, b) is var c and not 0 ? c : a.CompareTo(b));
            var byString = Enumerable.Range(0, words.Length).ToArray();
            Array.Sort(byString, (a, b) => string.CompareOrdinal(words[a], words[b]) is var c and not 0 ? c : a.CompareTo(b));
            Assert.Equal(byString, byPacked);
        }, iter: 200);
    }

    [Fact]
    public void A_sorted_list_of_files_keeps_the_first_of_two_equal_paths_and_each_ones_full_path()
    {
        var builder = new DiscoveredFiles.Builder("/r");
        builder.Add("motors/b.yaml", "", "/elsewhere/motors/b.yaml");
        builder.Add("motors/", "a.yaml");
        builder.Add("motors/", "b.yaml");
        builder.Add("buses/x.yaml", "");
        var files = builder.Build();

        Assert.Equal(["buses/x.yaml", "motors/a.yaml", "motors/b.yaml"], files.Select(f => f.RelativePath));
        Assert.Equal("/elsewhere/motors/b.yaml", files[2].FullPath);
        Assert.Equal(Path.Combine("/r", "motors", "a.yaml"), files[1].FullPath);
        Assert.Equal(files[1], files[1]);
    }

    [Fact]
    public void An_unsorted_list_keeps_every_file_in_the_order_of_adding()
    {
        var builder = new DiscoveredFiles.Builder("/r");
        Assert.Equal(0, builder.Add("z.yaml", ""));
        Assert.Equal(1, builder.Add("a.yaml", ""));
        Assert.Equal(2, builder.Add("a.yaml", ""));
        Assert.Equal(["z.yaml", "a.yaml", "a.yaml"], builder.Build(sorted: false).Select(f => f.RelativePath));
    }
}
