namespace LaunchLogger.Cli.Bench;

/// <summary>The groups <c>bench accuracy</c> reports, in print order.</summary>
public enum BenchGroup
{
    /// <summary>Simulated; accelerometer; undriven pickup; edge timestamps or a counter polled
    /// faster than every 0.75 ms.</summary>
    SimulatedAccelUndriven,

    /// <summary>The same, polled every 0.75–1.5 ms (goals within 1.5×).</summary>
    SimulatedAccelUndrivenPoll1Ms,

    /// <summary>The same, polled every 1.5–10 ms.</summary>
    SimulatedAccelUndrivenPollCoarse,

    /// <summary>Simulated; accelerometer; pickup on a driven wheel.</summary>
    SimulatedAccelDriven,

    /// <summary>Simulated; pulses only; undriven pickup.</summary>
    SimulatedPulsesUndriven,

    /// <summary>Simulated; pulses only; driven pickup.</summary>
    SimulatedPulsesDriven,

    /// <summary>Generator: standing starts of many profiles.</summary>
    GeneratedStanding,

    /// <summary>Generator: a long idle before a standing start.</summary>
    GeneratedLongIdle,

    /// <summary>Generator: records that open moving (5–60 mph).</summary>
    GeneratedRolling,

    /// <summary>Generator: steady cruise, then a stop with a brake rise of 0.05–2 s or a steady rise.</summary>
    GeneratedCruiseStop,

    /// <summary>Generator: the stops above again, written as logs with a brake switch (delay
    /// 5–25 ms, not told to the decoder); polled loops stall 20 ms about once a second.</summary>
    GeneratedCruiseStopSwitch,

    /// <summary>Generator: two standing runs in one record.</summary>
    GeneratedStopAndGo,

    /// <summary>Generator: the standing starts above again, the same car, sensors and draws, with
    /// the launch taking up smoothly (a raised-cosine rise, the jerk starting from zero) instead of
    /// a linear ramp.</summary>
    GeneratedStandingSmooth,

    /// <summary>Generator: every other standing start above again (the first, third, …), the same
    /// car, sensors and draws, with the launch's ramp taken up through a first-order lag of 0.02–0.15 s (the acceleration
    /// starting like τ² and easing into the ramp, reaching the peak later by up to the lag).</summary>
    GeneratedStandingLagged,

    /// <summary>Generator: the records that open moving above again, pulses only, the pickup on a
    /// wheel of the car's one driven pair slipping by a drawn slip law (the same car, tyre, pickup
    /// and noise otherwise); told driven with <c>--pickup-wheel-told</c>. Made only with that option
    /// or when named by <c>--group</c>, so the default bench is as it was.</summary>
    GeneratedRollingPulsesDriven,
}
