import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { CameraScanButton, CameraScanDialog, cameraProblemOf } from './camera-scanner';

// The camera APIs are mocked: getUserMedia, the video element and the browser's BarcodeDetector.
const stopTrack = vi.fn();
const fakeStream = () => ({ getTracks: () => [{ stop: stopTrack }] }) as unknown as MediaStream;

function mockCamera(getUserMedia: () => Promise<MediaStream>) {
  Object.defineProperty(navigator, 'mediaDevices', { configurable: true, value: { getUserMedia: vi.fn(getUserMedia) } });
}

function mockDetector(detect: () => Promise<{ rawValue: string; format: string }[]>, formats = ['code_128', 'qr_code', 'ean_13', 'upc_a']) {
  const detector = { detect: vi.fn(detect) };
  const Detector = vi.fn(function (this: unknown) {
    return detector;
  }) as unknown as { getSupportedFormats: () => Promise<string[]> };
  Detector.getSupportedFormats = async () => formats;
  vi.stubGlobal('BarcodeDetector', Detector);
  return { Detector: Detector as unknown as ReturnType<typeof vi.fn>, detector };
}

// Generous waits: the suite shares a busy machine.
const slow = { timeout: 5000 };

const domError = (name: string) => Object.assign(new Error(name), { name });

beforeEach(() => {
  // jsdom has no media playback.
  vi.spyOn(HTMLMediaElement.prototype, 'play').mockResolvedValue(undefined);
  stopTrack.mockClear();
});
afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
  Reflect.deleteProperty(navigator, 'mediaDevices');
});

describe('CameraScanDialog', () => {
  it('reads a code with the browser detector, stops the camera and hands the code over', async () => {
    mockCamera(async () => fakeStream());
    const { detector, Detector } = mockDetector(async () => [{ rawValue: ' HW-1042-B ', format: 'code_128' }]);
    const onDetected = vi.fn();
    render(<CameraScanDialog open onClose={() => {}} onDetected={onDetected} />);
    await waitFor(() => expect(onDetected).toHaveBeenCalledWith('HW-1042-B'), slow);
    expect(onDetected).toHaveBeenCalledTimes(1);
    expect(detector.detect).toHaveBeenCalled();
    // Asked only for what we read: Code 128, QR, EAN/UPC that the browser supports.
    expect(Detector).toHaveBeenCalledWith({ formats: ['code_128', 'qr_code', 'ean_13', 'upc_a'] });
    expect(stopTrack).toHaveBeenCalled();
    expect(navigator.mediaDevices.getUserMedia).toHaveBeenCalledWith({ video: { facingMode: { ideal: 'environment' } }, audio: false });
  });

  it('says the camera was refused and falls back to typing', async () => {
    mockCamera(async () => {
      throw domError('NotAllowedError');
    });
    const onDetected = vi.fn();
    render(<CameraScanDialog open onClose={() => {}} onDetected={onDetected} />);
    const alert = await screen.findByRole('alert', {}, slow);
    expect(alert).toHaveTextContent('Camera access refused');
    expect(alert).toHaveTextContent('allow the camera for this site');
    const field = screen.getByLabelText('Or type the number');
    await waitFor(() => expect(field).toHaveFocus(), slow);
    expect(screen.queryByLabelText('Camera picture')).not.toBeInTheDocument();

    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Use this number' }));
    expect(onDetected).not.toHaveBeenCalled();
    expect(screen.getByText('Type the number, or scan it with the camera.')).toBeInTheDocument();
    await user.type(field, 'HW-77{Enter}');
    expect(onDetected).toHaveBeenCalledWith('HW-77');
  });

  it('explains a browser without camera access, and offers no retry', async () => {
    render(<CameraScanDialog open onClose={() => {}} onDetected={() => {}} />);
    expect(await screen.findByRole('alert', {}, slow)).toHaveTextContent('secure (https) page');
    expect(screen.queryByRole('button', { name: 'Try the camera again' })).not.toBeInTheDocument();
  });

  it('lets a busy camera be tried again', async () => {
    let calls = 0;
    mockCamera(async () => {
      calls += 1;
      if (calls === 1) throw domError('NotReadableError');
      return fakeStream();
    });
    mockDetector(async () => []);
    render(<CameraScanDialog open onClose={() => {}} onDetected={() => {}} />);
    expect(await screen.findByRole('alert', {}, slow)).toHaveTextContent('in use by another app');
    await userEvent.setup().click(screen.getByRole('button', { name: 'Try the camera again' }));
    expect(await screen.findByText(/Looking for a barcode/, {}, slow)).toBeInTheDocument();
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
  });

  it('sorts camera errors into what a person can do about them', () => {
    expect(cameraProblemOf(domError('NotAllowedError'))).toBe('denied');
    expect(cameraProblemOf(domError('SecurityError'))).toBe('denied');
    expect(cameraProblemOf(domError('NotFoundError'))).toBe('no-camera');
    expect(cameraProblemOf(domError('OverconstrainedError'))).toBe('no-camera');
    expect(cameraProblemOf(domError('NotReadableError'))).toBe('busy');
    expect(cameraProblemOf(new Error('odd'))).toBe('failed');
    expect(cameraProblemOf('nonsense')).toBe('failed');
  });

  it('stops the camera when closed before anything is read', async () => {
    mockCamera(async () => fakeStream());
    mockDetector(async () => []);
    const { rerender } = render(<CameraScanDialog open onClose={() => {}} onDetected={() => {}} />);
    await screen.findByText(/Looking for a barcode/, {}, slow);
    rerender(<CameraScanDialog open={false} onClose={() => {}} onDetected={() => {}} />);
    expect(stopTrack).toHaveBeenCalled();
  });
});

describe('CameraScanButton', () => {
  it('opens the scanner and closes it with the code', async () => {
    mockCamera(async () => fakeStream());
    mockDetector(async () => [{ rawValue: '5012345678900', format: 'ean_13' }]);
    const onDetected = vi.fn();
    render(<CameraScanButton onDetected={onDetected} />);
    await userEvent.setup().click(screen.getByRole('button', { name: 'Scan' }));
    await waitFor(() => expect(onDetected).toHaveBeenCalledWith('5012345678900'), slow);
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
  });
});
