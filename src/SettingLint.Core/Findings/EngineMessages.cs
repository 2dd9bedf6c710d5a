using System.Collections.Immutable;

namespace SettingLint.Core.Findings;

/// <summary>One message of an engine rule: its id (unique within the rule) and its template, whose {name} holes the finding's named values fill.</summary>
/// <param name="RuleId">The engine rule (SL0xx) that reports it.</param>
/// <param name="Id">The message id, as SARIF names a rule's message strings: stable across versions while the meaning stays.</param>
/// <param name="Template">The wording with {name} holes.</param>
public sealed record EngineMessage(string RuleId, string Id, string Template);

/// <summary>
/// Every message the engine rules report, in one place: a finding of an engine rule names its message by id and
/// carries its variable parts as named values, as the findings of data rules do.
/// </summary>
public static class EngineMessages
{
    public static EngineMessage FileIsUtf16 { get; } = new(EngineRules.Syntax, "fileIsUtf16",
        "The file is UTF-16; setting files must be UTF-8.");

    public static EngineMessage NotValidUtf8 { get; } = new(EngineRules.Syntax, "notValidUtf8",
        "The file is not valid UTF-8: byte {offset} (0x{value}) at line {line}, column {column} cannot be decoded.");

    public static EngineMessage LineBreakOfYaml11 { get; } = new(EngineRules.Syntax, "lineBreakOfYaml11",
        "The file contains U+{code} at line {line}, column {column}: a line break in YAML 1.1 but not in 1.2, so tools would disagree on the lines; use a plain line feed.");

    public static EngineMessage ControlCharacter { get; } = new(EngineRules.Syntax, "controlCharacter",
        "The file contains the control character U+{code} at line {line}, column {column}; YAML does not allow it.");

    public static EngineMessage AliasNamesAnchorDefined { get; } = new(EngineRules.Syntax, "aliasNamesAnchorDefined",
        "The alias *{alias} names no anchor defined before it.");

    public static EngineMessage YamlSyntaxError { get; } = new(EngineRules.Syntax, "yamlSyntaxError",
        "YAML syntax error: {detail}");

    public static EngineMessage RowDoesLoadAs { get; } = new(EngineRules.Syntax, "rowDoesLoadAs",
        "Row {row}: {file} does not load as a YAML mapping; correct it before updating it from the sheet.");

    public static EngineMessage KeyAppearsTwiceMapping { get; } = new(EngineRules.DuplicateKey, "keyAppearsTwiceMapping",
        "The key '{key}' appears twice in this mapping: first at line {firstLine}, column {firstColumn}, again at line {line}, column {column}; a second value would silently win in most tools.");

    public static EngineMessage RowColumnAlsoHeader { get; } = new(EngineRules.DuplicateKey, "rowColumnAlsoHeader",
        "Row {row}, column {column}: '{path}' is also the header of column {other}; a key takes one column.");

    public static EngineMessage ProtectionSettingWithUnit { get; } = new(EngineRules.UnknownKey, "protectionSettingWithUnit",
        "'{key}' is not a protection setting with a unit{hint}.");

    public static EngineMessage UnknownKeyDidYou { get; } = new(EngineRules.UnknownKey, "unknownKeyDidYou",
        "Unknown key '{key}'{where}; did you mean '{suggestion}'?");

    public static EngineMessage UnknownKeyKnownKeys { get; } = new(EngineRules.UnknownKey, "unknownKeyKnownKeys",
        "Unknown key '{key}'{where}; the known keys here are {known}.");

    public static EngineMessage RowColumnHeaderKey { get; } = new(EngineRules.UnknownKey, "rowColumnHeaderKey",
        "Row {row}, column {column}: the header '{header}' is not a key path of a motor-protection file{hint}. Name a key path (such as motor.full_load_current [A]), or map the header with --map (to a key path or to 'ignore').");

    public static EngineMessage RowColumnStandsColumn { get; } = new(EngineRules.UnknownKey, "rowColumnStandsColumn",
        "Row {row}, column {column}: '{value}' stands in a column with no usable header.");

    public static EngineMessage RequiredKeyMissing { get; } = new(EngineRules.MissingKey, "requiredKeyMissing",
        "The required key '{key}'{title} is missing{where}.");

    public static EngineMessage RequiredKeyKindMissing { get; } = new(EngineRules.MissingKey, "requiredKeyKindMissing",
        "The required key 'kind' is missing{hint}; a setting file starts with kind ({kinds}) and format.");

    public static EngineMessage RequiredKeyFormatMissing { get; } = new(EngineRules.MissingKey, "requiredKeyFormatMissing",
        "The required key 'format' is missing; this version reads format 1.");

    public static EngineMessage RowColumnTagOne { get; } = new(EngineRules.MissingKey, "rowColumnTagOne",
        "Row {row}: no column is the tag; one column must be headed 'tag' (or be mapped to it): each row is one motor, and its file is named from its tag.");

    public static EngineMessage RowHasTagColumn { get; } = new(EngineRules.MissingKey, "rowHasTagColumn",
        "Row {row} has no tag (column {column}); each row is one motor, and its file is named from its tag.");

    public static EngineMessage NegativeHereCannot { get; } = new(EngineRules.WrongType, "negativeHereCannot",
        "'{value}' is negative; a {dimension} here cannot be.");

    public static EngineMessage ZeroBaseRatioRelative { get; } = new(EngineRules.WrongType, "zeroBaseRatioRelative",
        "'{value}' is zero; it is the base of a ratio or of relative settings and must be above zero.");

    public static EngineMessage NotFiniteNumber { get; } = new(EngineRules.WrongType, "notFiniteNumber",
        "'{value}' is not a finite number.");

    public static EngineMessage WrongValueType { get; } = new(EngineRules.WrongType, "wrongValueType",
        "'{key}' must be {expected}, not {what}.");

    public static EngineMessage ValueOutsideDomain { get; } = new(EngineRules.WrongType, "valueOutsideDomain",
        "'{key}' {detail}; it is {what}.");

    public static EngineMessage RowTagMakesFile { get; } = new(EngineRules.WrongType, "rowTagMakesFile",
        "Row {row}, {column}: the tag '{tag}' makes no file name; a tag needs a letter or digit.");

    public static EngineMessage RowTagAlsoOn { get; } = new(EngineRules.WrongType, "rowTagAlsoOn",
        "Row {row}, {column}: the tag '{tag}' is also on row {other}; both rows would be the file {file}.");

    public static EngineMessage RowExistsAlreadyImport { get; } = new(EngineRules.WrongType, "rowExistsAlreadyImport",
        "Row {row}, {column}: {file} exists already; import never overwrites a file. Pass --update to change only the values the sheet holds (comments and other keys are kept).");

    public static EngineMessage RowTagAlreadyUsed { get; } = new(EngineRules.WrongType, "rowTagAlreadyUsed",
        "Row {row}, {column}: the tag '{tag}' is already used by {file}; a tag names one piece of equipment in the repository (pass --update to change that file).");

    public static EngineMessage RowHasDecimalComma { get; } = new(EngineRules.WrongType, "rowHasDecimalComma",
        "Row {row}, {column}: '{value}' has a decimal comma{quoted}; setting files take a decimal point ('{pointed}'). Save the sheet with a point as the decimal separator, or correct the cell.");

    public static EngineMessage RowHoldsMappingList { get; } = new(EngineRules.WrongType, "rowHoldsMappingList",
        "Row {row}, {column}: {file} holds a mapping or a list on the way to '{path}'; a cell cannot replace it.");

    public static EngineMessage UnitProblem { get; } = new(EngineRules.Unit, "unitProblem",
        "{problem}");

    public static EngineMessage CannotBeConverted { get; } = new(EngineRules.Unit, "cannotBeConverted",
        "'{value}' cannot be converted: {missing}.");

    public static EngineMessage RowColumnUnitHeader { get; } = new(EngineRules.Unit, "rowColumnUnitHeader",
        "Row {row}, column {column}: the unit in the header does not fit: {problem}");

    public static EngineMessage RowHasUnitWrite { get; } = new(EngineRules.Unit, "rowHasUnitWrite",
        "Row {row}, {column}: '{value}' has no unit; write it in the cell ('{value} {unit}') or once in the header ('{path} [{unit}]'). Units here: {accepted}.");

    public static EngineMessage ReferenceAbsolute { get; } = new(EngineRules.Reference, "referenceAbsolute",
        "'{path}' is an absolute path; a reference is relative to the file that makes it, inside the repository.");

    public static EngineMessage ReferenceOutsideRoot { get; } = new(EngineRules.Reference, "referenceOutsideRoot",
        "'{path}' lies outside the repository root; it is not read.");

    public static EngineMessage ReferenceIsFolder { get; } = new(EngineRules.Reference, "referenceIsFolder",
        "'{path}' is a folder; a reference names a {kind} file.");

    public static EngineMessage ReferenceMissing { get; } = new(EngineRules.Reference, "referenceMissing",
        "'{path}' does not exist (looked for {full}).");

    public static EngineMessage ReferenceThroughLink { get; } = new(EngineRules.Reference, "referenceThroughLink",
        "'{path}' leads out of the repository root through a symbolic link; it is not followed.");

    public static EngineMessage ReferenceDoesNotLoad { get; } = new(EngineRules.Reference, "referenceDoesNotLoad",
        "'{path}' does not load as a setting file, so the {kind} cannot be used; check that file for its own findings.");

    public static EngineMessage ReferenceWrongKind { get; } = new(EngineRules.Reference, "referenceWrongKind",
        "'{path}' is a {actual} file, not a {kind} file.");

    public static EngineMessage FolderLiesSymbolicLink { get; } = new(EngineRules.Reference, "folderLiesSymbolicLink",
        "This folder is (or lies in) a symbolic link to {target}, outside the repository root; it is not read.");

    public static EngineMessage FileSymbolicLinkOutside { get; } = new(EngineRules.Reference, "fileSymbolicLinkOutside",
        "This file is a symbolic link to {target}, outside the repository root; it is not followed.");

    public static EngineMessage FileSymbolicLinkWhich { get; } = new(EngineRules.Reference, "fileSymbolicLinkWhich",
        "This file is a symbolic link to {target}, which does not exist; it is not followed.");

    public static EngineMessage FileLiesFolderSymbolic { get; } = new(EngineRules.Reference, "fileLiesFolderSymbolic",
        "This file lies in a folder that is a symbolic link to {target}, outside the repository root; it is not read.");

    public static EngineMessage RowWritePathFile { get; } = new(EngineRules.Reference, "rowWritePathFile",
        "Row {row}, {column}: {what}; write the path of a {kind} file relative to the new file, or the tag of one in the repository{known}.");

    public static EngineMessage FileBytesOverLimit { get; } = new(EngineRules.Limit, "fileBytesOverLimit",
        "The file is {size} bytes, over the limit of {limit} bytes; it is not read.");

    public static EngineMessage AliasRefersNodeContains { get; } = new(EngineRules.Limit, "aliasRefersNodeContains",
        "The alias *{alias} refers to the node that contains it; a recursive structure is not accepted.");

    public static EngineMessage AliasesExpandMoreThan { get; } = new(EngineRules.Limit, "aliasesExpandMoreThan",
        "Aliases expand to more than {limit} nodes (an alias bomb?); the file is not read further.");

    public static EngineMessage NestingDeeperThanLevels { get; } = new(EngineRules.Limit, "nestingDeeperThanLevels",
        "Nesting is deeper than {limit} levels; the file is not read further.");

    public static EngineMessage TooManyNodes { get; } = new(EngineRules.Limit, "tooManyNodes",
        "The file has more than {limit} nodes; it is not read further.");

    public static EngineMessage UnknownKindSettingFile { get; } = new(EngineRules.KindOrFormat, "unknownKindSettingFile",
        "Unknown kind {kind}; a setting file is one of {kinds}.");

    public static EngineMessage UnknownFormatVersionSettinglint { get; } = new(EngineRules.KindOrFormat, "unknownFormatVersionSettinglint",
        "Unknown format {format}; this version of SettingLint reads format 1.");

    public static EngineMessage AcceptanceNamesRuleWrite { get; } = new(EngineRules.Suppression, "acceptanceNamesRuleWrite",
        "This acceptance names no rule; write the rule ids before the colon, as in '# {marker} SL110: why it is acceptable'.");

    public static EngineMessage AcceptanceGivesReasonSo { get; } = new(EngineRules.Suppression, "acceptanceGivesReasonSo",
        "This acceptance of {ids} gives no reason, so it accepts nothing; write the reason after a colon: '# {marker} {ids}: why it is acceptable'.");

    public static EngineMessage AcceptanceStandsBeforeNothing { get; } = new(EngineRules.Suppression, "acceptanceStandsBeforeNothing",
        "This acceptance of {ids} stands before nothing: no YAML follows it.");

    public static EngineMessage CannotAcceptedSourceReports { get; } = new(EngineRules.Suppression, "cannotAcceptedSourceReports",
        "{id} cannot be accepted in the source: it reports on acceptances and on changes to the gate themselves.");

    public static EngineMessage AcceptanceNamesWhichRule { get; } = new(EngineRules.Suppression, "acceptanceNamesWhichRule",
        "This acceptance names {id}, which is not a rule of this run (see 'settinglint rules list').");

    public static EngineMessage FindingLiesOnWhich { get; } = new(EngineRules.Suppression, "findingLiesOnWhich",
        "No {id} finding lies on {lines}, which this acceptance covers: it is stale; remove {id} from it, or the whole comment.");

    public static EngineMessage TagAlreadyUsedBy { get; } = new(EngineRules.DuplicateTag, "tagAlreadyUsedBy",
        "The tag '{tag}' is already used by {other}; a tag names one piece of equipment in the repository.");

    public static EngineMessage SecondDocumentIgnored { get; } = new(EngineRules.SecondDocument, "secondDocumentIgnored",
        "A setting file holds one YAML document; a second one starts here and would be ignored.");

    public static EngineMessage KeyMustPlainWord { get; } = new(EngineRules.KeyNotPlain, "keyMustPlainWord",
        "A key must be a plain word, not {what}.");

    public static EngineMessage RuleFileMappingKeys { get; } = new(EngineRules.NotAMapping, "ruleFileMappingKeys",
        "A rule file is a mapping of keys.");

    public static EngineMessage ConfigurationMappingKeys { get; } = new(EngineRules.NotAMapping, "configurationMappingKeys",
        "The configuration is a mapping of keys.");

    public static EngineMessage FailOnFewerFindings { get; } = new(EngineRules.GateChange, "failOnFewerFindings",
        "fail_on is now {new} (it was {old}): fewer findings fail the run.");

    public static EngineMessage SwitchedOffLongerReports { get; } = new(EngineRules.GateChange, "switchedOffLongerReports",
        "{id} is switched off (it was {old}): it no longer reports anything.");

    public static EngineMessage SeverityLoweredFrom { get; } = new(EngineRules.GateChange, "severityLoweredFrom",
        "The severity of {id} is lowered from {old} to {new}.");

    public static EngineMessage ParameterChangedFromCheck { get; } = new(EngineRules.GateChange, "parameterChangedFromCheck",
        "The parameter {parameter} of {id} changed from {old} to {new}; check that the change does not loosen the rule.");

    public static EngineMessage RulePackLongerUsed { get; } = new(EngineRules.GateChange, "rulePackLongerUsed",
        "The rule pack {pack} is no longer used: its rules do not run.");

    public static EngineMessage FilesMatchingExcludedLonger { get; } = new(EngineRules.GateChange, "filesMatchingExcludedLonger",
        "Files matching {glob} are now excluded: they are no longer checked.");

    public static EngineMessage OnlyFilesMatchingChecked { get; } = new(EngineRules.GateChange, "onlyFilesMatchingChecked",
        "Only files matching {globs} are checked now (every YAML file was before).");

    public static EngineMessage FilesMatchingLongerIncluded { get; } = new(EngineRules.GateChange, "filesMatchingLongerIncluded",
        "Files matching {glob} are no longer included: they are not checked.");

    public static EngineMessage DefaultChangedFromCheck { get; } = new(EngineRules.GateChange, "defaultChangedFromCheck",
        "The default of {parameter} in {id} changed from {old} to {new}; check that the change does not loosen the rule.");

    public static EngineMessage ChangedCheckRuleStill { get; } = new(EngineRules.GateChange, "changedCheckRuleStill",
        "The {key} of {id} changed; check that the rule still fires where it should.");

    public static EngineMessage NewBaselineAcceptsFindings { get; } = new(EngineRules.GateChange, "newBaselineAcceptsFindings",
        "A new baseline accepts {count} findings: they no longer fail the run.");

    public static EngineMessage BaselineAcceptsAtFinding { get; } = new(EngineRules.GateChange, "baselineAcceptsAtFinding",
        "The baseline now accepts {id} at {file} {keyPath}: that finding no longer fails the run.");

    public static EngineMessage NewAcceptanceOnFinding { get; } = new(EngineRules.GateChange, "newAcceptanceOnFinding",
        "A new acceptance of {id} on {lines}: '{reason}'. A finding it covers no longer fails the run.");

    public static EngineMessage CodeNoLongerNfpa70 { get; } = new(EngineRules.GateChange, "codeNoLongerNfpa70",
        "electrical_code is now {new} (it was {old}): the rules of NFPA 70 (SL801) no longer run on some of the motors this file governs.");

    public static EngineMessage CodeChanged { get; } = new(EngineRules.GateChange, "codeChanged",
        "electrical_code is now {new} (it was {old}): check which rules of the packs in use stop or start running.");

    public static EngineMessage RuleDeleted { get; } = new(EngineRules.GateChange, "ruleDeleted",
        "The rule {id} was deleted from its pack: it no longer runs.");

    public static EngineMessage RuleFileNoLongerLoads { get; } = new(EngineRules.GateChange, "ruleFileNoLongerLoads",
        "The rule file of {id} no longer loads: its rule does not run.");

    public static EngineMessage NoCompliantValue { get; } = new(EngineRules.NoCompliantValue, "noCompliantValue",
        "No value of {setting} satisfies every rule on it: {lower_rule} needs it {lower_phrase} {lower} ({lower_label}), {upper_rule} {upper_phrase} {upper} ({upper_label}); the motor data or the scheme must change, not the setting.");

    /// <summary>
    /// A finding of any engine rule on a value an import takes from a sheet, restated at its cell: the same id under
    /// every rule, with the finding's own message as the value "problem".
    /// </summary>
    public static EngineMessage InSheetCell(string ruleId) => new(ruleId, "inSheetCell", "Row {row}, {column}: {problem}");

    /// <summary>All engine messages, in the order of their rules (besides <see cref="InSheetCell"/>, which any rule may report).</summary>
    public static ImmutableArray<EngineMessage> All { get; } =
    [
        FileIsUtf16,
        NotValidUtf8,
        LineBreakOfYaml11,
        ControlCharacter,
        AliasNamesAnchorDefined,
        YamlSyntaxError,
        RowDoesLoadAs,
        KeyAppearsTwiceMapping,
        RowColumnAlsoHeader,
        ProtectionSettingWithUnit,
        UnknownKeyDidYou,
        UnknownKeyKnownKeys,
        RowColumnHeaderKey,
        RowColumnStandsColumn,
        RequiredKeyMissing,
        RequiredKeyKindMissing,
        RequiredKeyFormatMissing,
        RowColumnTagOne,
        RowHasTagColumn,
        NegativeHereCannot,
        ZeroBaseRatioRelative,
        NotFiniteNumber,
        WrongValueType,
        ValueOutsideDomain,
        RowTagMakesFile,
        RowTagAlsoOn,
        RowExistsAlreadyImport,
        RowTagAlreadyUsed,
        RowHasDecimalComma,
        RowHoldsMappingList,
        UnitProblem,
        CannotBeConverted,
        RowColumnUnitHeader,
        RowHasUnitWrite,
        ReferenceAbsolute,
        ReferenceOutsideRoot,
        ReferenceIsFolder,
        ReferenceMissing,
        ReferenceThroughLink,
        ReferenceDoesNotLoad,
        ReferenceWrongKind,
        FolderLiesSymbolicLink,
        FileSymbolicLinkOutside,
        FileSymbolicLinkWhich,
        FileLiesFolderSymbolic,
        RowWritePathFile,
        FileBytesOverLimit,
        AliasRefersNodeContains,
        AliasesExpandMoreThan,
        NestingDeeperThanLevels,
        TooManyNodes,
        UnknownKindSettingFile,
        UnknownFormatVersionSettinglint,
        AcceptanceNamesRuleWrite,
        AcceptanceGivesReasonSo,
        AcceptanceStandsBeforeNothing,
        CannotAcceptedSourceReports,
        AcceptanceNamesWhichRule,
        FindingLiesOnWhich,
        TagAlreadyUsedBy,
        SecondDocumentIgnored,
        KeyMustPlainWord,
        RuleFileMappingKeys,
        ConfigurationMappingKeys,
        FailOnFewerFindings,
        SwitchedOffLongerReports,
        SeverityLoweredFrom,
        ParameterChangedFromCheck,
        RulePackLongerUsed,
        FilesMatchingExcludedLonger,
        OnlyFilesMatchingChecked,
        FilesMatchingLongerIncluded,
        DefaultChangedFromCheck,
        ChangedCheckRuleStill,
        NewBaselineAcceptsFindings,
        BaselineAcceptsAtFinding,
        NewAcceptanceOnFinding,
        RuleDeleted,
        RuleFileNoLongerLoads,
        NoCompliantValue,
    ];
}
