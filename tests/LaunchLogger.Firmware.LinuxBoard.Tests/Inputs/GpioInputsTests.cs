using System.Device.Gpio;
using LaunchLogger.Firmware.LinuxBoard.Inputs;
using LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Inputs;

public class GpioInputsTests
{
    [Theory]
    [InlineData("active low, pin low", true, 0, true)]
    [InlineData("active low, pin high", true, 1, false)]
    [InlineData("active high, pin high", false, 1, true)]
    [InlineData("active high, pin low", false, 0, false)]
    public void Input_level_maps_to_active_through_a_real_GpioController(string name, bool activeLow, int level, bool expected)
    {
        _ = name;
        var driver = new FakeGpioDriver();
        using var controller = new GpioController(driver);
        driver.SetInput(27, level == 1 ? PinValue.High : PinValue.Low);

        var input = new GpioDigitalInput(controller, 27, activeLow, PinMode.InputPullUp);

        Assert.Equal(PinMode.InputPullUp, driver.Mode(27));
        Assert.Equal(expected, input.IsActive());
        driver.SetInput(27, level == 1 ? PinValue.Low : PinValue.High);
        Assert.Equal(!expected, input.IsActive());
    }

    [Fact]
    public void Output_modes_are_refused_for_an_input()
    {
        using var controller = new GpioController(new FakeGpioDriver());
        Assert.Throws<ArgumentException>(() => new GpioDigitalInput(controller, 5, true, PinMode.Output));
    }

    [Fact]
    public void Led_pin_is_an_output_that_ends_dark()
    {
        var driver = new FakeGpioDriver();
        using var controller = new GpioController(driver);
        using (var led = new GpioStatusLed(controller, 23))
        {
            Assert.Equal(PinMode.Output, driver.Mode(23));
            led.Show(RunPhase.Staged);
            Assert.Equal(PinValue.High, driver.Level(23));
        }

        Assert.Equal(PinValue.Low, driver.Level(23));
    }
}
