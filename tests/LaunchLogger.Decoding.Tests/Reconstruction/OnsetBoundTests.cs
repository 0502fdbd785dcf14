using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>An accelerometer onset bounded above by the first pulse (motion begins by the end of
/// the first pulse's bracket): an onset before the pulse is left as it is, one read a little after
/// it (within 3σ) is taken at the pulse with its σ, one further after it is refused.</summary>
public class OnsetBoundTests
{
    [Fact]
    public void An_onset_before_the_first_pulse_is_left_as_it_is()
    {
        Assert.Equal(new Estimate(1.0, 1e-3), ReconstructionPass.BoundedAbove(new Estimate(1.0, 1e-3), 1.0002));
    }

    [Fact]
    public void An_onset_read_a_little_after_the_first_pulse_is_taken_at_it()
    {
        Assert.Equal(new Estimate(1.0, 1e-3), ReconstructionPass.BoundedAbove(new Estimate(1.0025, 1e-3), 1.0));
    }

    [Fact]
    public void An_onset_far_after_the_first_pulse_contradicts_it()
    {
        Assert.Null(ReconstructionPass.BoundedAbove(new Estimate(1.0035, 1e-3), 1.0));
    }
}
