namespace LaunchLogger.Simulation.Scenarios;

/// <summary>One point of an engine's full-throttle torque curve.</summary>
/// <param name="Rpm">Engine speed, revolutions per minute.</param>
/// <param name="TorqueNm">Torque at the crank, N·m.</param>
public sealed record TorquePoint(double Rpm, double TorqueNm);
