namespace LaunchLogger.Archive.Importing;

/// <summary>A time the serial link was down during a capture.</summary>
/// <param name="AtByte">Offset in the captured bytes where the link was lost (bytes before it arrived).</param>
/// <param name="LostUtc">When it was lost.</param>
/// <param name="DownS">How long it stayed down, s.</param>
public sealed record LinkGap(long AtByte, DateTime LostUtc, double DownS);
