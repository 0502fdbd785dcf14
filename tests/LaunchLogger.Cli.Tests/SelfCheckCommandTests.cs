using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

public class SelfCheckCommandTests
{
    [Fact]
    public void TheFirmwareCorePassesItsSelfCheck()
    {
        var output = new StringWriter();
        Assert.Equal(ExitCode.Ok, SelfCheckCommand.Run(output));
        Assert.Contains("result: OK", output.ToString());
        Assert.Contains("CRC or stuffing errors: 0", output.ToString());
    }
}
