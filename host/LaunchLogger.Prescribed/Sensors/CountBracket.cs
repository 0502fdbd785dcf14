namespace LaunchLogger.Prescribed.Sensors;

/// <summary>One reading of a polled counter: the count reached <paramref name="Count"/> at some
/// time in (<paramref name="LoS"/>, <paramref name="HiS"/>].</summary>
public readonly record struct CountBracket(double LoS, double HiS, long Count);
