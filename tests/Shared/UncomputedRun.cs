using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reporting;

namespace LaunchLogger.Tests.Shared;

/// <summary>A run whose first motion could not be computed (not a number), as a noiseless
/// accelerometer once gave: for the outputs that must say so in words.</summary>
internal static class UncomputedRun
{
    /// <summary>The run's report: first motion NaN ± NaN, nothing else measured.</summary>
    public static RunReport FirstMotionNotANumber()
    {
        var figures = new FigureSet
        {
            FirstMotionS = new Estimate(double.NaN, double.NaN),
            RolloutDistanceM = 0.3048,
            SpeedIntervals = [],
            DistanceMarks = [],
            PeakAccelMps2 = 0,
            MaxSpeedMps = 0,
            DistanceM = 0,
        };
        return RunReportBuilder.Build(1, "pulses and accelerometer", true, figures, null, []);
    }
}
