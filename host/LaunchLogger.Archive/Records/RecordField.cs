namespace LaunchLogger.Archive.Records;

/// <summary>One field of a record kind, as it is given on the command line and exported.</summary>
/// <param name="Name">The field's name: its option (<c>--name</c>) and its export column.</param>
/// <param name="Column">Its column in the archive.</param>
/// <param name="Kind">What it holds.</param>
/// <param name="Description">For --help.</param>
/// <param name="Referenced">For references: the kind of record named.</param>
/// <param name="Required">True when a record cannot be added without it.</param>
public sealed record RecordField(string Name, string Column, FieldKind Kind, string Description, RecordKind? Referenced = null, bool Required = false);
