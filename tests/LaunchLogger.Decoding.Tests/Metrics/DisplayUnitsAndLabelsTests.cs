using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.Tests.Metrics;

/// <summary>The units people read and the names of the standard figures.</summary>
public class DisplayUnitsAndLabelsTests
{
    [Fact]
    public void ImperialIsMphAndFeetMetricIsKmhAndMetres()
    {
        // NIST SP 811 (2008), appendix B: 1 mph = 0.44704 m/s and 1 ft = 0.3048 m exactly (the
        // international foot of 1959); 1 km/h = 1000 m / 3600 s by the SI definitions.
        Assert.Equal(0.44704, DisplayUnits.Imperial.MpsPerSpeedUnit(), 15);
        Assert.Equal(1000.0 / 3600.0, DisplayUnits.Metric.MpsPerSpeedUnit(), 15);
        Assert.Equal(0.3048, DisplayUnits.Imperial.MetresPerDistanceUnit(), 15);
        Assert.Equal(1.0, DisplayUnits.Metric.MetresPerDistanceUnit(), 15);
        Assert.Equal(("mph", "ft"), (DisplayUnits.Imperial.SpeedUnit(), DisplayUnits.Imperial.DistanceUnit()));
        Assert.Equal(("km/h", "m"), (DisplayUnits.Metric.SpeedUnit(), DisplayUnits.Metric.DistanceUnit()));

        // 26.8224 m/s is 60 mph (60 × 0.44704) and 96.56064 km/h; 402.336 m is 1320 ft.
        Assert.Equal(60, DisplayUnits.Imperial.Speed(26.8224), 12);
        Assert.Equal(96.56064, DisplayUnits.Metric.Speed(26.8224), 12);
        Assert.Equal(1320, DisplayUnits.Imperial.Distance(402.336), 12);
        Assert.Equal(402.336, DisplayUnits.Metric.Distance(402.336), 12);
    }

    [Fact]
    public void TheStandardFiguresCarryTheNamesOfTheTrade()
    {
        // Common practice: drag-strip marks in feet (60 ft, 330 ft, 1/8 and 1/4 mile with 66-ft
        // speed traps), acceleration intervals in mph and km/h.
        FigureRequest request = FigureRequest.Standard;
        Assert.Equal(
            new[] { "60 ft", "330 ft", "660 ft (1/8 mile)", "1000 ft", "1320 ft (1/4 mile)", "100 m", "200 m", "400 m" },
            request.DistanceMarks.Select(m => m.Label));
        Assert.Equal(
            new[] { "0-30 mph", "0-60 mph", "0-100 km/h", "0-200 km/h", "5-60 mph", "30-50 mph", "50-70 mph", "80-120 km/h" },
            request.SpeedIntervals.Select(i => i.Label));
        Assert.Equal(330 * 0.3048, request.DistanceMarks[1].DistanceM, 12);
    }
}
