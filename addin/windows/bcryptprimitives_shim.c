/* TEST ONLY: a stand-in for bcryptprimitives.dll, which Wine 8.0 (Debian 12) lacks and
 * Rust's standard library imports (ProcessPrng). Windows 10 and later have the real one;
 * it is never shipped, only placed beside the test program under Wine. */
#include <windows.h>
#include <bcrypt.h>
__declspec(dllexport) BOOL WINAPI ProcessPrng(PBYTE data, SIZE_T len) {
    return BCryptGenRandom(NULL, data, (ULONG)len, BCRYPT_USE_SYSTEM_PREFERRED_RNG) == 0;
}
