namespace LaunchLogger.Cli;

/// <summary>The cautions shown on first run and by <c>launchlogger safety</c>.</summary>
public static class SafetyNotice
{
    /// <summary>The cautions, one per line.</summary>
    public const string Text =
        "SAFETY — read before you use LaunchLogger in a car:\n" +
        "  * Acceleration and braking runs belong on closed courses only, never on public roads.\n" +
        "  * Follow the venue's rules and the organiser's instructions, local law, and licensed\n" +
        "    practice for any change to the vehicle.\n" +
        "  * Keep all wiring clear of brake lines, brake hoses and ABS sensors and their harnesses;\n" +
        "    fuse the supply where you tap it.\n" +
        "  * Bolt or strap the box down so it cannot fly loose under hard braking or in a crash.\n" +
        "  * Nobody operates the box or reads its screen while the car is moving.\n";

    /// <summary>Prints the cautions the first time the tool runs for this user, and remembers
    /// that it did in a marker file (under LAUNCHLOGGER_HOME, or the user's config folder).</summary>
    public static void ShowOnFirstRun(TextWriter error)
    {
        try
        {
            string home = Environment.GetEnvironmentVariable("LAUNCHLOGGER_HOME")
                ?? Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.ApplicationData, Environment.SpecialFolderOption.Create), "launchlogger");
            string marker = Path.Combine(home, "safety-notice-shown");
            if (File.Exists(marker))
            {
                return;
            }

            error.WriteLine(Text);
            Directory.CreateDirectory(home);
            File.WriteAllText(marker, "The safety notice was shown on " + DateTime.UtcNow.ToString("u") + "\n");
        }
        catch (IOException)
        {
            // A read-only home must not stop the tool; the notice was printed or will be next time.
        }
        catch (UnauthorizedAccessException)
        {
        }
    }
}
