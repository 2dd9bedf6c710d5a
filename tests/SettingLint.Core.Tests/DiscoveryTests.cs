using SettingLint.Core.Discovery;
using SettingLint.Core.Engine;
using SettingLint.Core.Findings;
using SettingLint.Core.Rules;
using SettingLint.Tests.Support;

namespace SettingLint.Core.Tests;

/// <summary>Finding the files to check: which are taken, in what order, and which links are refused.</summary>
public sealed class DiscoveryTests
{
    private static string[] Relative(DiscoveryResult result) => [.. result.Files.Select(f => f.RelativePath)];

    [Fact]
    public void Hidden_and_build_folders_are_skipped_and_only_yaml_is_taken()
    {
        using var repo = new TempRepo();
        repo.Write("motors/a.yaml", "kind: bus\n");
        repo.Write("motors/b.yml", "kind: bus\n");
        repo.Write("motors/c.YAML", "kind: bus\n");
        repo.Write("motors/readme.md", "kind: bus\n");
        repo.Write("motors/d.yaml.bak", "kind: bus\n");
        repo.Write(".github/workflows/ci.yml", "on: push\n");
        repo.Write(".git/config.yaml", "x: 1\n");
        repo.Write("motors/.drafts/e.yaml", "kind: bus\n");
        repo.Write("bin/f.yaml", "kind: bus\n");
        repo.Write("obj/g.yaml", "kind: bus\n");
        repo.Write("node_modules/pkg/h.yaml", "kind: bus\n");
        repo.Write(".hidden-file.yaml", "x: 1\n"); // a hidden file (not folder) is still a YAML file
        var result = FileDiscovery.Find(repo.Root, [repo.Root]);
        Assert.Equal([".hidden-file.yaml", "motors/a.yaml", "motors/b.yml", "motors/c.YAML"], Relative(result));
        Assert.Empty(result.Findings);
        Assert.Empty(result.Missing);
    }

    [Fact]
    public void A_walked_file_s_full_path_is_made_from_the_root_and_a_named_file_keeps_its_own()
    {
        using var repo = new TempRepo();
        repo.Write("motors/a/m-1.yaml", "kind: bus\n");
        repo.Write("top.yaml", "kind: bus\n");
        var walked = FileDiscovery.Find(repo.Root, [Path.Combine(repo.Root, "motors")]).Files.Concat(FileDiscovery.Find(repo.Root, [repo.Root]).Files).ToArray();
        Assert.Equal(["motors/a/m-1.yaml", "motors/a/m-1.yaml", "top.yaml"], walked.Select(f => f.RelativePath));
        Assert.Equal([repo.PathOf("motors/a/m-1.yaml"), repo.PathOf("motors/a/m-1.yaml"), repo.PathOf("top.yaml")], walked.Select(f => f.FullPath));
        Assert.All(walked, f => Assert.True(File.Exists(f.FullPath)));

        // Named with a "." in it: the full path as normalised, the same file as the walk's (equal, whatever way each was made).
        var named = Assert.Single(FileDiscovery.Find(repo.Root, [Path.Combine(repo.Root, "motors", ".", "a", "m-1.yaml")]).Files);
        Assert.Equal((repo.PathOf("motors/a/m-1.yaml"), "motors/a/m-1.yaml"), (named.FullPath, named.RelativePath));
        Assert.Equal(walked[0], named);
        Assert.Equal(walked[0].GetHashCode(), named.GetHashCode());
        Assert.Equal(DiscoveredFile.Under(repo.Root, "top.yaml"), new DiscoveredFile(repo.PathOf("top.yaml"), "top.yaml"));
        Assert.NotEqual(DiscoveredFile.Under(repo.Root, "top.yaml"), new DiscoveredFile("/elsewhere/top.yaml", "top.yaml"));
        Assert.Equal((true, true, false, false), (walked[2].IsUnder(repo.Root), named.IsUnder(repo.Root),
            new DiscoveredFile("/elsewhere/top.yaml", "top.yaml").IsUnder(repo.Root), walked[2].IsUnder("/elsewhere")));
        Assert.Equal("DiscoveredFile { FullPath = " + repo.PathOf("top.yaml") + ", RelativePath = top.yaml }", DiscoveredFile.Under(repo.Root, "top.yaml").ToString());
    }

    // Common practice for CI tools: output order must not depend on the file system's enumeration order.
    [Fact]
    public void The_order_is_ordinal_by_relative_path_and_repeatable()
    {
        using var repo = new TempRepo();
        string[] names = ["z.yaml", "a/z.yaml", "B.yaml", "a.yaml", "a-b/c.yaml", "a/b/c.yaml", "_x.yaml", "a0.yaml"];
        foreach (var n in names) repo.Write(n, "kind: bus\n");
        var first = Relative(FileDiscovery.Find(repo.Root, [repo.Root]));
        Assert.Equal(names.Order(StringComparer.Ordinal), first);
        Assert.Equal(first, Relative(FileDiscovery.Find(repo.Root, [repo.PathOf("a"), repo.Root, repo.PathOf("a/z.yaml")])));
    }

    [Fact]
    public void An_explicit_file_and_a_missing_path()
    {
        using var repo = new TempRepo();
        repo.Write("motors/a.yaml", "kind: bus\n");
        repo.Write("motors/b.yaml", "kind: bus\n");
        var missing = Path.Combine(repo.Root, "nope");
        var result = FileDiscovery.Find(repo.Root, [repo.PathOf("motors/b.yaml"), missing]);
        Assert.Equal(["motors/b.yaml"], Relative(result));
        Assert.Equal([missing], result.Missing);
    }

    [Fact]
    public void A_symlink_to_a_file_outside_the_root_is_SL007_and_not_taken()
    {
        using var repo = new TempRepo();
        var outside = repo.WriteOutside("secret.yaml", "kind: bus\nformat: [\n");
        Directory.CreateDirectory(repo.PathOf("buses"));
        File.CreateSymbolicLink(repo.PathOf("buses/linked.yaml"), outside);
        repo.Write("buses/own.yaml", Samples.Bus);
        var result = FileDiscovery.Find(repo.Root, [repo.Root]);
        Assert.Equal(["buses/own.yaml"], Relative(result));
        var finding = Assert.Single(result.Findings);
        Assert.Equal(EngineRules.Reference, finding.RuleId);
        Assert.Equal("buses/linked.yaml", finding.File);
        Assert.Equal(SettingLint.Core.Documents.SourceSpan.FileStart, finding.Span);
        Assert.Contains("outside the repository", finding.Message, StringComparison.Ordinal);

        // End to end: the target's syntax error would be SL001 if it were read.
        var check = new Checker(EmptyRuleSet.Instance).Run(new CheckOptions([repo.Root]));
        Assert.Equal([(EngineRules.Reference, "buses/linked.yaml")], check.Findings.Select(f => (f.RuleId, f.File)));
    }

    [Fact]
    public void A_symlink_to_a_file_inside_the_root_is_taken()
    {
        using var repo = new TempRepo();
        var target = repo.Write("buses/own.yaml", Samples.Bus);
        File.CreateSymbolicLink(repo.PathOf("alias.yaml"), target);
        var result = FileDiscovery.Find(repo.Root, [repo.Root]);
        Assert.Equal(["alias.yaml", "buses/own.yaml"], Relative(result));
        Assert.Empty(result.Findings);
    }

    [Fact]
    public void A_dangling_symlink_is_SL007_and_says_so()
    {
        using var repo = new TempRepo();
        File.CreateSymbolicLink(repo.PathOf("gone.yaml"), repo.PathOf("never-written.yaml"));
        var result = FileDiscovery.Find(repo.Root, [repo.Root]);
        Assert.Empty(result.Files);
        var finding = Assert.Single(result.Findings);
        Assert.Equal(EngineRules.Reference, finding.RuleId);
        Assert.DoesNotContain("outside", finding.Message, StringComparison.Ordinal);
        Assert.Contains("does not exist", finding.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_symlinked_folder_out_of_the_root_is_not_followed()
    {
        using var repo = new TempRepo();
        repo.WriteOutside("elsewhere/motors/x.yaml", "kind: bus\n");
        repo.Write("motors/own.yaml", "kind: bus\n");
        Directory.CreateSymbolicLink(repo.PathOf("motors/external"), Path.Combine(repo.Outer, "elsewhere"));
        var result = FileDiscovery.Find(repo.Root, [repo.Root]);
        Assert.Equal(["motors/own.yaml"], Relative(result));
        Assert.Empty(result.Findings);
    }

    [Fact]
    public void A_file_named_through_a_symlinked_folder_out_of_the_root_is_not_taken()
    {
        using var repo = new TempRepo();
        repo.WriteOutside("elsewhere/x.yaml", "kind: bus\n");
        Directory.CreateSymbolicLink(repo.PathOf("external"), Path.Combine(repo.Outer, "elsewhere"));
        var explicitFile = FileDiscovery.Find(repo.Root, [repo.PathOf("external/x.yaml")]);
        Assert.Empty(explicitFile.Files);
        Assert.Equal(EngineRules.Reference, Assert.Single(explicitFile.Findings).RuleId);
        var explicitFolder = FileDiscovery.Find(repo.Root, [repo.PathOf("external")]);
        Assert.Empty(explicitFolder.Files);
        Assert.Equal(EngineRules.Reference, Assert.Single(explicitFolder.Findings).RuleId);
    }

    [Fact]
    public void IsInside_follows_links_below_the_root()
    {
        using var repo = new TempRepo();
        repo.Write("real/x.yaml", "kind: bus\n");
        Directory.CreateDirectory(Path.Combine(repo.Outer, "elsewhere"));
        Directory.CreateSymbolicLink(repo.PathOf("out"), Path.Combine(repo.Outer, "elsewhere"));
        Directory.CreateSymbolicLink(repo.PathOf("in"), repo.PathOf("real"));
        Assert.True(RepositoryRoot.IsInside(repo.Root, repo.PathOf("in/x.yaml")));
        Assert.True(RepositoryRoot.IsInside(repo.Root, repo.PathOf("real/not-yet.yaml")));
        Assert.True(RepositoryRoot.IsInside(repo.Root, repo.Root));
        Assert.False(RepositoryRoot.IsInside(repo.Root, repo.PathOf("out/x.yaml")));
        Assert.False(RepositoryRoot.IsInside(repo.Root, repo.PathOf("out")));
        Assert.False(RepositoryRoot.IsInside(repo.Root, Path.Combine(repo.Outer, "elsewhere")));
    }

    [Fact]
    public void A_symlinked_folder_that_loops_back_is_walked_once()
    {
        using var repo = new TempRepo();
        repo.Write("a/x.yaml", "kind: bus\n");
        Directory.CreateSymbolicLink(repo.PathOf("a/up"), repo.Root);
        var result = FileDiscovery.Find(repo.Root, [repo.Root]);
        Assert.Equal(["a/x.yaml"], Relative(result));
    }

    // setting-files contract: files whose YAML has no `kind` key are not setting files and are skipped;
    // a .yaml file that cannot be parsed is never skipped silently.
    [Fact]
    public void Files_without_kind_are_skipped_but_unparsable_ones_are_not()
    {
        using var repo = new TempRepo();
        Samples.WriteMinimal(repo);
        repo.Write("notes/ci.yaml", "steps:\n  - run: build\n");
        repo.Write("notes/list.yaml", "- a\n- b\n");
        repo.Write("notes/empty.yaml", "");
        repo.Write("notes/broken.yaml", "steps: [\n");
        var result = new Checker(EmptyRuleSet.Instance).Run(new CheckOptions([repo.Root]));
        Assert.Equal(3, result.FilesChecked); // bus, motor, and the broken file
        var finding = Assert.Single(result.Findings);
        Assert.Equal((EngineRules.Syntax, "notes/broken.yaml"), (finding.RuleId, finding.File));
    }

    [Fact]
    public void The_root_is_the_nearest_folder_with_git()
    {
        using var repo = new TempRepo();
        repo.Write("motors/deep/m.yaml", "kind: bus\n");
        Assert.Equal(repo.Root, RepositoryRoot.Find(repo.PathOf("motors/deep/m.yaml")));
        Assert.Equal(repo.Root, RepositoryRoot.Find(repo.PathOf("motors/deep")));
        Assert.Equal(repo.Root, RepositoryRoot.Find(repo.Root + Path.DirectorySeparatorChar));
        File.WriteAllText(Path.Combine(repo.PathOf("motors"), ".git"), "gitdir: elsewhere\n"); // a worktree's .git file
        Assert.Equal(repo.PathOf("motors"), RepositoryRoot.Find(repo.PathOf("motors/deep/m.yaml")));
    }

    [Fact]
    public void Containment_is_by_whole_path_segments()
    {
        Assert.True(RepositoryRoot.Contains("/r/repo", "/r/repo"));
        Assert.True(RepositoryRoot.Contains("/r/repo/", "/r/repo/a.yaml"));
        Assert.False(RepositoryRoot.Contains("/r/repo", "/r/repository/a.yaml"));
        Assert.False(RepositoryRoot.Contains("/r/repo", "/r"));
    }

    [Fact]
    public void Outside_git_the_root_is_the_outermost_folder_with_a_configuration_else_the_current_folder()
    {
        using var repo = new TempRepo(git: false);
        var motor = repo.Write("plant/motors/p-101.yaml", "kind: motor-protection\n");
        // No .git and no .settinglint.yaml: the current folder when the file lies below it, else the file's folder.
        Assert.Equal(repo.PathOf("plant"), RepositoryRoot.Find(motor, repo.PathOf("plant")));
        Assert.Equal(repo.PathOf("plant/motors"), RepositoryRoot.Find(motor, repo.Outer + "-elsewhere"));
        // A .settinglint.yaml above the file marks the root, wherever the current folder is.
        repo.Write("plant/.settinglint.yaml", "fail_on: error\n");
        Assert.Equal(repo.PathOf("plant"), RepositoryRoot.Find(motor, repo.PathOf("plant/motors")));
        // A folder's own configuration below it does not move the root: the outermost configuration marks it.
        repo.Write("plant/motors/.settinglint.yaml", "electrical_code: IEC 60364\n");
        Assert.Equal(repo.PathOf("plant"), RepositoryRoot.Find(motor, repo.PathOf("plant/motors")));
        Assert.Equal(repo.PathOf("plant"), RepositoryRoot.Find(motor, repo.Outer + "-elsewhere"));
        // A git work tree wins over a nearer configuration.
        Directory.CreateDirectory(repo.PathOf(".git"));
        Assert.Equal(repo.Root, RepositoryRoot.Find(motor, repo.PathOf("plant/motors")));
    }
}
