namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Which wheel carries the distance pickup, as the user tells it (settings file
/// <c>pickup_wheel</c>, <c>launchlogger report --pickup-wheel</c>): with pulses only, nothing in
/// the data says whether the wheel is driven, and a driven tyre's launch slip makes its pulses
/// count more than the car covered (<see cref="ReconstructionOptions.DrivenLaunchSlip"/>).</summary>
public enum PickupWheel
{
    /// <summary>Not told: a driven wheel's launch slip is carried in σ about an unmoved estimate
    /// (<see cref="ReconstructionOptions.PulsesOnlyLaunchSlip"/>).</summary>
    NotSaid = 0,

    /// <summary>A driven wheel, one of the pair of the car's one driven axle: with pulses only,
    /// the estimate is moved back by the launch slip's and the drive slip's expected values and σ
    /// keeps their spread.</summary>
    Driven,

    /// <summary>An undriven wheel: no launch slip (it lags only by its spin-up, modelled apart).</summary>
    Undriven,

    /// <summary>A wheel of a car whose four wheels are all driven: each tyre passes about a quarter
    /// of the drive on a quarter of the load, half the force over load of a driven pair's, so its
    /// drive slip is about half theirs and a launch need not take it to its grip peak
    /// (<see cref="ReconstructionOptions.AllWheelsDrivenSlip"/>).</summary>
    DrivenAllWheels,
}
