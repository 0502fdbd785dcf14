namespace LaunchLogger.Archive.Records;

/// <summary>What a record's field holds, and so how its text is checked.</summary>
public enum FieldKind
{
    /// <summary>Free text.</summary>
    Text,

    /// <summary>A calendar date, yyyy-MM-dd.</summary>
    Date,

    /// <summary>Weather as T_C,P_hPa,RH_pct (station pressure), e.g. 18.5,1008,62.</summary>
    Weather,

    /// <summary>The name of another record (a venue, a class…).</summary>
    Reference,
}
