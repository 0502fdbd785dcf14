using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Decoding.Tests.Memory;

/// <summary>A long run's smoother keeps a checkpoint every 1024 grid points and replays the
/// stretches the backward pass needs, instead of keeping every filtered state (160 bytes a point):
/// the same trajectory, bit for bit, in less memory. Forced here on an ordinary run by setting
/// the number of states kept whole to almost nothing.</summary>
[Collection(MemoryCollection.Name)]
public class LongRunMemoryTests
{
    private const int BytesPerFilteredState = 160; // 5 state values and 15 covariance values, 8 bytes each

    [Fact]
    public void ReplayedFilterStatesGiveTheSameTrajectoryInLessMemory()
    {
        // A minute and more at 1 kHz: about 28,000 grid points, so that the kept states (about 4.5 MB)
        // are far larger than the working arrays small enough to come from the shared pool.
        Scenario scenario = KilohertzRuns.Driven(2000);
        DecodedRun run = LogReader.Read(Simulator.Run(scenario, seed: 8).LogBytes, "run.log").Runs.Single();
        var kept = new ReconstructionOptions();
        ReconstructionOptions replayed = kept with { FilterStatesKept = 0 };
        Reconstructor.Reconstruct(run, kept); // warm up: the first call's one-off allocations are not counted

        long before = GC.GetAllocatedBytesForCurrentThread();
        ReconstructedRun whole = Reconstructor.Reconstruct(run, kept);
        long wholeBytes = GC.GetAllocatedBytesForCurrentThread() - before;
        before = GC.GetAllocatedBytesForCurrentThread();
        ReconstructedRun checkpointed = Reconstructor.Reconstruct(run, replayed);
        long checkpointedBytes = GC.GetAllocatedBytesForCurrentThread() - before;

        Trajectory a = whole.Trajectory;
        Trajectory b = checkpointed.Trajectory;
        Assert.Equal(a.TimeS, b.TimeS);
        Assert.Equal(a.DistanceM, b.DistanceM);
        Assert.Equal(a.SpeedMps, b.SpeedMps);
        Assert.Equal(a.AccelMps2, b.AccelMps2);
        Assert.Equal(a.DistanceSigmaM, b.DistanceSigmaM);
        Assert.Equal(a.SpeedSigmaMps, b.SpeedSigmaMps);
        Assert.Equal(whole.FirstMotionS, checkpointed.FirstMotionS);
        Assert.Equal(whole.RolloutTimeS, checkpointed.RolloutTimeS);

        // The smoother runs at least once over the grid; each run saves (almost) all its states.
        long saved = wholeBytes - checkpointedBytes;
        long states = (long)a.TimeS.Length * BytesPerFilteredState;
        Assert.True(a.TimeS.Length > 8 * 1024, $"the run should span many replayed stretches ({a.TimeS.Length:N0} grid points)");
        Assert.True(saved > 0.8 * states, $"replaying saved {saved:N0} bytes of allocation; the filtered states of {a.TimeS.Length:N0} grid points are {states:N0} bytes");
    }
}
