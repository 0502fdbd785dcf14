namespace LaunchLogger.Decoding.Metrics;

/// <summary>A distance down the strip to time, measured from the car's standstill position.</summary>
/// <param name="Label">How people write it, e.g. "60 ft" or "1320 ft (1/4 mile)".</param>
/// <param name="DistanceM">Distance from the standstill position, m.</param>
/// <param name="TrapLengthM">Length of the speed trap that ends at this mark, m; null for none.
/// Common practice: a 66-ft trap before the 660-ft and 1320-ft lines (mph = 45 / Δt).</param>
public sealed record DistanceMark(string Label, double DistanceM, double? TrapLengthM = null)
{
    /// <summary>Makes a mark in feet.</summary>
    public static DistanceMark Feet(string label, double feet, double? trapFeet = null) =>
        new(label, feet * Units.MetresPerFoot, trapFeet * Units.MetresPerFoot);

    /// <summary>Makes a mark in metres.</summary>
    public static DistanceMark Metres(double metres) => new($"{metres:0} m", metres);
}
