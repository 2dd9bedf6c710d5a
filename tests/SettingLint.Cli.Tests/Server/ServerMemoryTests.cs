using System.Globalization;
using Xunit.Abstractions;

namespace SettingLint.Cli.Tests.Server;

/// <summary>Runs alone: managed memory is a process-wide figure, and other tests running beside it would move it.</summary>
[CollectionDefinition(nameof(ServerMemoryCollection), DisableParallelization = true)]
public sealed class ServerMemoryCollection;

/// <summary>A long editing session must not make the server grow: each check's results replace the last.</summary>
[Collection(nameof(ServerMemoryCollection))]
public sealed class ServerMemoryTests(ITestOutputHelper output)
{
    [Fact]
    public async Task Managed_memory_after_1000_edits_is_that_after_100_within_a_bound()
    {
        using var repo = new SettingLint.Tests.Support.TempRepo();
        var examples = Path.Combine(RepositoryPaths.Root(), "examples");
        // The demo's configuration names its company pack (firm-rules/) beside the built-in one: it comes along.
        foreach (var rel in (string[])[".settinglint.yaml", "firm-rules/pack.yaml", "firm-rules/TWE101/rule.yaml", "motors/p-202.yaml", "buses/sg-41a.yaml", "models/standard-motor-relay.yaml"])
        {
            repo.WriteBytes(rel, File.ReadAllBytes(Path.Combine(examples, rel)));
        }
        var motor = repo.PathOf("motors/p-202.yaml");
        var text = File.ReadAllText(motor);
        var fixedText = text.Replace("    pickup: 46 A pri", "    pickup: 46 A sec", StringComparison.Ordinal);
        Assert.NotEqual(text, fixedText);
        await using var session = await ServerSession.Start(repo.Root);
        await session.Open(motor, text);
        await session.Client.Diagnostics(ServerSession.Uri(motor), 1);

        // Every edit is checked and published (each waited for), alternating a finding on and off.
        async Task Edit(int version)
        {
            var wrong = version % 2 == 0;
            await session.Change(motor, version, wrong ? text : fixedText);
            var d = await session.Client.Diagnostics(ServerSession.Uri(motor), version);
            Assert.Equal(wrong, d.Any(x => (string)x!["code"]! == "SL201"));
            session.Client.Forget();
        }
        var version = 1;
        while (version < 101) await Edit(++version);
        var after100 = Settled();
        while (version < 1001) await Edit(++version);
        var after1000 = Settled();
        var growth = after1000 - after100;
        output.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"managed memory after 100 edits: {after100 / 1024.0:F0} KiB, after 1000: {after1000 / 1024.0:F0} KiB, growth {growth / 1024.0:F0} KiB"));
        // Generous: the whole demo motor's bound document is some tens of KiB, so a leak of one per edit would be
        // tens of MiB over 900 edits, while noise of the runtime's own caches is well under 8 MiB.
        Assert.True(growth < 8L * 1024 * 1024, string.Create(CultureInfo.InvariantCulture, $"grew {growth / 1024.0:F0} KiB over 900 edits (from {after100 / 1024.0:F0} KiB)"));
        Assert.Equal(0, await session.ShutdownAndExit());
    }

    private static long Settled()
    {
        for (var i = 0; i < 3; i++)
        {
            GC.Collect(GC.MaxGeneration, GCCollectionMode.Forced, blocking: true, compacting: true);
            GC.WaitForPendingFinalizers();
        }
        return GC.GetTotalMemory(forceFullCollection: true);
    }
}
