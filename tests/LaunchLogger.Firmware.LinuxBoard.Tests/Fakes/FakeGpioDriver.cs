using System.Device.Gpio;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;

/// <summary>A GPIO driver whose pins are a dictionary, so System.Device.Gpio's real
/// GpioController can be driven in tests (GpioDriver is abstract: HARDWARE-FACTS.md).</summary>
internal sealed class FakeGpioDriver : GpioDriver
{
    private readonly Dictionary<int, PinValue> values = new();
    private readonly Dictionary<int, PinMode> modes = new();

    public List<(int Pin, PinValue Value)> Writes { get; } = new();

    public void SetInput(int pin, PinValue value) => values[pin] = value;

    public PinValue Level(int pin) => values.TryGetValue(pin, out PinValue v) ? v : PinValue.Low;

    public PinMode Mode(int pin) => modes[pin];

    protected override int PinCount => 64;

    protected override void OpenPin(int pinNumber) => values.TryAdd(pinNumber, PinValue.Low);

    protected override void ClosePin(int pinNumber) => modes.Remove(pinNumber);

    protected override void SetPinMode(int pinNumber, PinMode mode) => modes[pinNumber] = mode;

    protected override PinMode GetPinMode(int pinNumber) => modes[pinNumber];

    protected override bool IsPinModeSupported(int pinNumber, PinMode mode) => true;

    protected override PinValue Read(int pinNumber) => Level(pinNumber);

    protected override void Write(int pinNumber, PinValue value)
    {
        lock (Writes)
        {
            values[pinNumber] = value;
            Writes.Add((pinNumber, value));
        }
    }

    protected override WaitForEventResult WaitForEvent(int pinNumber, PinEventTypes eventTypes, CancellationToken cancellationToken) => throw new NotSupportedException();

    protected override void AddCallbackForPinValueChangedEvent(int pinNumber, PinEventTypes eventTypes, PinChangeEventHandler callback) => throw new NotSupportedException();

    protected override void RemoveCallbackForPinValueChangedEvent(int pinNumber, PinChangeEventHandler callback) => throw new NotSupportedException();
}
