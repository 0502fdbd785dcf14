namespace LaunchLogger.Simulation.Scenarios;

/// <summary>How the box learns about pulse edges.</summary>
public enum CaptureKind
{
    /// <summary>Every edge timestamped (Linux GPIO line events, a capture timer): brackets one
    /// microsecond wide, late by the timestamping latency.</summary>
    ExactEdges,

    /// <summary>A hardware edge counter polled by the main loop (ESP32): brackets one loop period
    /// wide, several edges may land in one.</summary>
    PolledCounter,
}
