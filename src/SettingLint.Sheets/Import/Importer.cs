using System.Collections.Immutable;
using System.Text;
using SettingLint.Core.Binding;
using SettingLint.Core.Discovery;
using SettingLint.Core.Documents;
using SettingLint.Core.Findings;
using SettingLint.Core.Loading;
using SettingLint.Core.Quantities;
using SettingLint.Core.Validation;
using SettingLint.Sheets.Tables;

namespace SettingLint.Sheets.Import;

/// <summary>What `import` is asked to do.</summary>
/// <param name="File">The CSV or XLSX file.</param>
/// <param name="OutDir">Where new files go.</param>
/// <param name="Sheet">The sheet of a workbook (null: the first).</param>
/// <param name="MapFile">A map of the sheet's headers to key paths, or null.</param>
/// <param name="Update">Change the values of files that exist (else they are refused).</param>
/// <param name="SkipBadRows">Write the good rows when some rows have errors.</param>
public sealed record ImportOptions(string File, string OutDir, string? Sheet = null, string? MapFile = null, bool Update = false, bool SkipBadRows = false);

/// <summary>What happens to a file.</summary>
public enum FileChange
{
    New,
    Updated,
    Unchanged,
}

/// <summary>A file to write: its full path, its new text, and the sheet row it comes from.</summary>
public sealed record PlannedFile(string FullPath, string Text, FileChange Change, int Row);

/// <summary>The outcome of reading a sheet: the problems found at their cells, and the files to write (none when any row is bad, unless told to skip).</summary>
/// <param name="Root">The root the sheet's path is relative to in the problems.</param>
/// <param name="Problems">Findings located at cells of the sheet (its path relative to Root).</param>
/// <param name="Files">The files to write, in row order.</param>
/// <param name="Rows">The data rows read.</param>
/// <param name="BadRows">The rows with a problem (skipped when --skip-bad-rows).</param>
public sealed record ImportPlan(string Root, ImmutableArray<Finding> Problems, ImmutableArray<PlannedFile> Files, int Rows, ImmutableArray<int> BadRows)
{
    /// <summary>Whether a problem concerns the sheet as a whole (its header), so that no row can be written.</summary>
    public bool SheetBroken { get; init; }
}

/// <summary>
/// Turns the rows of a motor list into motor-protection files: one file per row, named from its tag. Every cell is
/// checked by the same loader and binder that `check` uses, and each problem is reported at its cell.
/// </summary>
public sealed class Importer
{
    private const string Kind = SchemaSet.MotorProtection;

    private readonly ImportOptions _options;
    private readonly ContractKeys _keys;
    private readonly string _root;
    private readonly string _outDir;
    private readonly FindingBuilder _problems;
    private readonly RepositoryFiles _repository;

    private Importer(ImportOptions options, string root, string sheetFile)
    {
        _options = options;
        _keys = ContractKeys.Of(Kind);
        _root = root;
        _outDir = Path.GetFullPath(options.OutDir);
        _problems = new FindingBuilder(sheetFile);
        _repository = RepositoryFiles.Scan(RepositoryRoot.Find(_outDir));
    }

    /// <summary>Reads the sheet and plans the files; throws <see cref="SheetReadException"/> when the sheet or the map cannot be read.</summary>
    public static ImportPlan Plan(ImportOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        var table = SheetFiles.Read(options.File, options.Sheet);
        var map = options.MapFile is { } m ? ImportMap.Read(m) : ImportMap.None;
        // Problems name the sheet relative to the repository it is in, or by its name beside its folder.
        var full = Path.GetFullPath(options.File);
        var repo = RepositoryRoot.Find(options.OutDir);
        var root = RepositoryRoot.Contains(repo, full) ? repo : Path.GetDirectoryName(full)!;
        return new Importer(options, root, RepositoryRoot.Relative(root, full)).Run(table, map);
    }

    private ImportPlan Run(SheetTable table, ImportMap map)
    {
        var headerIndex = table.Rows.IndexOf(table.Rows.FirstOrDefault(r => !r.IsEmpty));
        if (headerIndex < 0) return new ImportPlan(_root, [], [], 0, []);
        var columns = Columns(table.Rows[headerIndex], map);
        var broken = _problems.HasAny;
        var tagColumn = columns.Values.FirstOrDefault(c => c.Key?.Path == "tag");
        if (tagColumn is null)
        {
            var first = table.Rows[headerIndex][0];
            _problems.Add(EngineMessages.RowColumnTagOne, first.Region, "tag",
                ("row", Number(first.Row)));
            broken = true;
        }
        var files = new List<PlannedFile>();
        var bad = new List<int>();
        var seen = new Dictionary<string, int>(StringComparer.Ordinal);
        var rows = 0;
        for (var i = headerIndex + 1; i < table.Rows.Length; i++)
        {
            var row = table.Rows[i];
            if (row.IsEmpty || row.All(c => c.Text.Trim().Length == 0)) continue;
            rows++;
            var before = _problems.Findings.Count;
            var planned = broken ? null : Row(row, columns, tagColumn!, seen);
            if (_problems.Findings.Count > before) bad.Add(row[0].Row);
            else if (planned is not null) files.Add(planned);
        }
        var keep = bad.Count == 0 || (_options.SkipBadRows && !broken);
        return new ImportPlan(_root, [.. _problems.Findings], keep ? [.. files] : [], rows, [.. bad]) { SheetBroken = broken };
    }

    private Dictionary<int, ColumnSpec> Columns(ImmutableArray<SheetCell> header, ImportMap map)
    {
        var columns = new Dictionary<int, ColumnSpec>();
        var byPath = new Dictionary<string, SheetCell>(StringComparer.Ordinal);
        foreach (var cell in header)
        {
            var text = cell.Text.Trim();
            if (text.Length == 0) continue;
            var target = map.Target(text) ?? text;
            if (target == ImportMap.Ignore)
            {
                columns[cell.Column] = new ColumnSpec(cell, null, null);
                continue;
            }
            var (path, unit) = HeaderText.Split(target);
            if (_keys.Find(path) is not { } key)
            {
                var near = _keys.Nearest(path);
                _problems.Add(EngineMessages.RowColumnHeaderKey, cell.Region, path,
                    ("row", Number(cell.Row)), ("column", cell.ColumnName), ("header", text), ("hint", near is null ? "" : " (did you mean " + near + "?)"));
                continue;
            }
            if (byPath.TryGetValue(path, out var earlier))
            {
                _problems.Add(EngineMessages.RowColumnAlsoHeader, cell.Region, path,
                    ("row", Number(cell.Row)), ("column", cell.ColumnName), ("path", path), ("other", earlier.ColumnName));
                continue;
            }
            if (unit is not null && HeaderText.UnitProblem(key, unit) is { } why)
            {
                _problems.Add(EngineMessages.RowColumnUnitHeader, cell.Region, path,
                    ("row", Number(cell.Row)), ("column", cell.ColumnName), ("problem", why));
                continue;
            }
            byPath[path] = cell;
            columns[cell.Column] = new ColumnSpec(cell, key, unit);
        }
        return columns;
    }

    /// <summary>One value of a row on its way to the file.</summary>
    private sealed record CellValue(ContractKey Key, SheetCell Cell, ColumnSpec Column, string Text, string? ReferenceTarget);

    private PlannedFile? Row(ImmutableArray<SheetCell> row, Dictionary<int, ColumnSpec> columns, ColumnSpec tagColumn, Dictionary<string, int> seen)
    {
        var r = row[0].Row;
        var tagCell = row.FirstOrDefault(c => c.Column == tagColumn.Header.Column && c.Text.Trim().Length > 0);
        if (tagCell is null)
        {
            // The empty tag cell itself when the sheet has it (a CSV row does), else the row's first cell.
            var at = row.FirstOrDefault(c => c.Column == tagColumn.Header.Column) ?? row[0];
            _problems.Add(EngineMessages.RowHasTagColumn, at.Region, "tag",
                ("row", Number(r)), ("column", tagColumn.Header.ColumnName));
            return null;
        }
        var tag = tagCell.Text.Trim();
        var target = Target(tag, tagCell, tagColumn.Describe(), seen);
        if (target is null) return null;
        var dir = Path.GetDirectoryName(target)!;
        var values = new List<CellValue>();
        foreach (var cell in row)
        {
            var text = cell.Text.Trim();
            if (text.Length == 0) continue;
            if (!columns.TryGetValue(cell.Column, out var column))
            {
                _problems.Add(EngineMessages.RowColumnStandsColumn, cell.Region, "",
                    ("row", Number(r)), ("column", cell.ColumnName), ("value", text));
                continue;
            }
            if (column.Key is null) continue;
            if (Value(column, cell, text, dir) is { } value) values.Add(value);
        }
        return File(target, values, r);
    }

    /// <summary>The file a tag's row goes to, or null after reporting why it cannot be written.</summary>
    private string? Target(string tag, SheetCell tagCell, string column, Dictionary<string, int> seen)
    {
        var name = SheetFiles.FileName(tag);
        if (name is null)
        {
            _problems.Add(EngineMessages.RowTagMakesFile, tagCell.Region, "tag",
                ("row", Number(tagCell.Row)), ("column", column), ("tag", tag));
            return null;
        }
        var existing = _repository.Find(Kind, tag);
        var target = _options.Update && existing is not null ? existing : Path.Combine(_outDir, name);
        if (seen.TryGetValue(target, out var other))
        {
            _problems.Add(EngineMessages.RowTagAlsoOn, tagCell.Region, "tag",
                ("row", Number(tagCell.Row)), ("column", column), ("tag", tag), ("other", Number(other)), ("file", Relative(target)));
            return null;
        }
        seen[target] = tagCell.Row;
        if (!_options.Update)
        {
            if (System.IO.File.Exists(target))
            {
                _problems.Add(EngineMessages.RowExistsAlreadyImport, tagCell.Region, "tag",
                    ("row", Number(tagCell.Row)), ("column", column), ("file", Relative(target)));
                return null;
            }
            if (existing is not null)
            {
                _problems.Add(EngineMessages.RowTagAlreadyUsed, tagCell.Region, "tag",
                    ("row", Number(tagCell.Row)), ("column", column), ("tag", tag), ("file", Relative(existing)));
                return null;
            }
        }
        return target;
    }

    private CellValue? Value(ColumnSpec column, SheetCell cell, string text, string dir)
    {
        var key = column.Key!;
        if ((key.Dimension is not null || key.IsNumber) && SheetNumbers.DecimalComma(text) is { } pointed)
        {
            _problems.Add(EngineMessages.RowHasDecimalComma, cell.Region, key.Path,
                ("row", Number(cell.Row)), ("column", column.Describe()), ("value", text), ("pointed", pointed),
                ("quoted", cell.Quoted ? " (a quoted cell)" : ""));
            return null;
        }
        if (key.Dimension is { } dimension && QuantityParser.TryNumber(text, out _))
        {
            if (column.Unit is null)
            {
                var accepted = string.Join(", ", AcceptedUnits.For(dimension, UnitContexts.Of(key.Path)));
                _problems.Add(EngineMessages.RowHasUnitWrite, cell.Region, key.Path,
                    ("row", Number(cell.Row)), ("column", column.Describe()), ("value", text), ("unit", AcceptedUnits.For(dimension, UnitContexts.Of(key.Path))[0]),
                    ("path", key.Path), ("accepted", accepted));
                return null;
            }
            text = text + " " + column.Unit;
        }
        if (key.IsFlag && (text.Equals("true", StringComparison.OrdinalIgnoreCase) || text.Equals("false", StringComparison.OrdinalIgnoreCase)))
        {
            text = text.ToLowerInvariant();
        }
        if (SheetFiles.ReferencedKind(key.Path) is { } kind)
        {
            var resolved = Reference(kind, key, cell, column, text, dir);
            return resolved is null ? null : new CellValue(key, cell, column, resolved.Value.Written, resolved.Value.Full);
        }
        return new CellValue(key, cell, column, text, null);
    }

    /// <summary>A bus or relay-model reference: a path (relative to the new file) to a file of that kind, or the tag of one in the repository.</summary>
    private (string Written, string Full)? Reference(string kind, ContractKey key, SheetCell cell, ColumnSpec column, string text, string dir)
    {
        var isPath = text.Contains('/', StringComparison.Ordinal) || text.Contains('\\', StringComparison.Ordinal) || FileDiscovery.IsYaml(text);
        string? full = isPath ? Path.GetFullPath(Path.Combine(dir, text.Replace('\\', '/'))) : _repository.Find(kind, text);
        if (full is null || !System.IO.File.Exists(full) || RepositoryFiles.KindOf(full) != kind)
        {
            var known = string.Join(", ", _repository.Tags(kind).Take(12));
            _problems.Add(EngineMessages.RowWritePathFile, cell.Region, key.Path,
                ("row", Number(cell.Row)), ("column", column.Describe()), ("kind", kind),
                ("what", isPath ? $"there is no {kind} file at '{text}' (from {Relative(dir)})" : $"no {kind} file in the repository has the tag '{text}'"),
                ("known", known.Length == 0 ? "" : " (" + known + ")"));
            return null;
        }
        return (isPath ? text.Replace('\\', '/') : Path.GetRelativePath(dir, full).Replace('\\', '/'), full);
    }

    private PlannedFile? File(string target, List<CellValue> values, int row)
    {
        var ordered = values.OrderBy(v => v.Key.Order).ToList();
        string text;
        FileChange change;
        if (System.IO.File.Exists(target))
        {
            var before = System.IO.File.ReadAllText(target);
            var edits = ordered.Select(v => new ValueEdit(v.Key.Path, Scalar(v), s => Same(v, s, Path.GetDirectoryName(target)!))).ToList();
            IReadOnlyList<string> blocked;
            try
            {
                (text, blocked) = YamlUpdate.Apply(before, edits);
            }
            catch (InvalidOperationException)
            {
                var tag = values.First(v => v.Key.Path == "tag").Cell;
                _problems.Add(EngineMessages.RowDoesLoadAs, tag.Region, "tag",
                    ("row", Number(row)), ("file", Relative(target)));
                return null;
            }
            foreach (var path in blocked)
            {
                var v = values.First(x => x.Key.Path == path);
                _problems.Add(EngineMessages.RowHoldsMappingList, v.Cell.Region, path,
                    ("row", Number(row)), ("column", v.Column.Describe()), ("file", Relative(target)), ("path", path));
            }
            change = text == before ? FileChange.Unchanged : FileChange.Updated;
        }
        else
        {
            var all = new List<(string, string)>();
            // Keys with one allowed value (kind, format) are written whether the sheet has them or not.
            foreach (var key in _keys.All.Where(k => k.IsFixed && values.All(v => v.Key != k)))
            {
                all.Add((key.Path, key.FixedValue!));
            }
            all.AddRange(ordered.Select(v => (v.Key.Path, Scalar(v))));
            text = YamlText.Document(SchemaHeader(Path.GetDirectoryName(target)!), all);
            change = FileChange.New;
        }
        Validate(target, text, values);
        return new PlannedFile(target, text, change, row);
    }

    /// <summary>The engine's loader and binder over the text to be written; each of their findings on a key the sheet gave is a problem at that cell.</summary>
    private void Validate(string target, string text, List<CellValue> values)
    {
        var relative = Relative(target);
        var loaded = YamlLoader.Load(Encoding.UTF8.GetBytes(text), target, relative, LoadLimits.Default);
        var findings = new FindingBuilder(relative);
        if (loaded.Root is YMapping root) DocumentBinder.Bind(Kind, target, relative, root, findings, SchemaSet.Shared);
        foreach (var f in loaded.Findings.Concat(findings.Findings))
        {
            var v = values.FirstOrDefault(x => f.KeyPath == x.Key.Path || f.KeyPath.StartsWith(x.Key.Path + ".", StringComparison.Ordinal));
            if (v is null) continue; // a key the sheet does not hold: `check` reports it after writing
            _problems.Add(EngineMessages.InSheetCell(f.RuleId), v.Cell.Region, v.Key.Path,
                ("row", Number(v.Cell.Row)), ("column", v.Column.Describe()), ("problem", f.Message));
        }
    }

    private static string Scalar(CellValue v) =>
        YamlText.Scalar(v.Text, text: v.Key.Dimension is null && !v.Key.IsNumber && !v.Key.IsFlag);

    /// <summary>Whether the value in the file already means what the cell says: then it stays as written.</summary>
    private static bool Same(CellValue v, YScalar written, string dir)
    {
        if (written.Value == v.Text) return true;
        if (v.ReferenceTarget is { } full) return Path.GetFullPath(Path.Combine(dir, written.Value)) == full;
        if (v.Key.Dimension is { } d)
        {
            var context = UnitContexts.Of(v.Key.Path);
            var a = QuantityParser.Parse(written.Value, d, context);
            var b = QuantityParser.Parse(v.Text, d, context);
            return a.Ok && b.Ok && a.Value!.Value.Number == b.Value!.Value.Number && a.Value.Value.Unit.Symbol == b.Value.Value.Unit.Symbol;
        }
        if (v.Key.IsNumber)
        {
            return written.Type is ScalarType.Int or ScalarType.Float && QuantityParser.TryNumber(written.Value, out var a) && QuantityParser.TryNumber(v.Text, out var b) && a == b;
        }
        return false;
    }

    private string? SchemaHeader(string dir)
    {
        var schema = Path.Combine(RepositoryRoot.Find(_outDir), "schema", Kind + ".schema.json");
        return System.IO.File.Exists(schema) ? Path.GetRelativePath(dir, schema).Replace('\\', '/') : null;
    }

    private string Relative(string full) => Path.GetRelativePath(Directory.GetCurrentDirectory(), full).Replace('\\', '/');

    private static FindingValue Number(int n) => new(n.ToString(System.Globalization.CultureInfo.InvariantCulture), n);
}
