using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>An accelerometer onset bounded above by the first pulse: its normal truncated at the
/// bound. Checked against the half-normal's closed form (a unit normal cut at its mean keeps the
/// half below it: mean −√(2/π), σ √(1 − 2/π); any statistics text, from memory) and against the
/// two ends: an onset far before the pulse is left as it is, one far after it is refused.</summary>
public class OnsetBoundTests
{
    [Fact]
    public void An_onset_read_at_the_first_pulse_keeps_the_half_before_it()
    {
        Estimate bounded = ReconstructionPass.BoundedAbove(new Estimate(2.0, 1e-3), 2.0)!.Value;
        Assert.Equal(2.0 - (1e-3 * Math.Sqrt(2 / Math.PI)), bounded.Value, 9);
        Assert.Equal(1e-3 * Math.Sqrt(1 - (2 / Math.PI)), bounded.Sigma, 9);
    }

    [Fact]
    public void An_onset_well_before_the_first_pulse_is_left_as_it_is()
    {
        Estimate bounded = ReconstructionPass.BoundedAbove(new Estimate(1.0, 1e-3), 1.006)!.Value;
        Assert.Equal(1.0, bounded.Value, 8);
        Assert.Equal(1e-3, bounded.Sigma, 8);
    }

    [Fact]
    public void An_onset_read_a_little_after_the_first_pulse_moves_before_it()
    {
        Estimate bounded = ReconstructionPass.BoundedAbove(new Estimate(1.0015, 1e-3), 1.0)!.Value;
        Assert.True(bounded.Value < 1.0, $"{bounded.Value:R}");
        Assert.True(bounded.Sigma < 1e-3, $"{bounded.Sigma:R}");
        Assert.True(bounded.Value > 1.0 - 1e-3, $"{bounded.Value:R}");
    }

    [Fact]
    public void An_onset_far_after_the_first_pulse_contradicts_it()
    {
        Assert.Null(ReconstructionPass.BoundedAbove(new Estimate(1.0035, 1e-3), 1.0));
    }
}
