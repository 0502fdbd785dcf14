namespace LaunchLogger.Plots.Tests;

public sealed class ThinningTests
{
    [Fact]
    public void A_short_series_is_kept_whole()
    {
        double[] ys = [3, 1, 4, 1, 5];
        Assert.Equal([0, 1, 2, 3, 4], Thinning.Keep(ys, 100));
    }

    [Fact]
    public void A_long_series_keeps_its_ends_its_spike_and_its_dip_in_order()
    {
        var ys = new double[100_000];
        ys[31_337] = 9;
        ys[77_777] = -4;
        int[] keep = Thinning.Keep(ys, 500);
        Assert.True(keep.Length <= 2 * 500 + 2);
        Assert.Equal(0, keep[0]);
        Assert.Equal(ys.Length - 1, keep[^1]);
        Assert.Contains(31_337, keep);
        Assert.Contains(77_777, keep);
        Assert.Equal(keep.Order(), keep);
        Assert.Equal(9, Thinning.Pick(ys, keep).Max());
        Assert.Equal(-4, Thinning.Pick(ys, keep).Min());
    }
}
