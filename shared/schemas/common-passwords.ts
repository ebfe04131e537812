/**
 * Passwords too common to allow (lower case), from memory of the usual top lists of leaked passwords and
 * keyboard walks. The policy also refuses one character repeated, straight runs (12345678, abcdefgh) and
 * these words with digits or symbols added at the end (password1!, qwerty2024).
 */
export const COMMON_PASSWORDS: ReadonlySet<string> = new Set([
  'password', 'passw0rd', 'p@ssword', 'p@ssw0rd', 'pass', 'passwort', 'motdepasse', 'contrasena', 'wachtwoord',
  'qwerty', 'qwertz', 'azerty', 'qwertyuiop', 'asdfghjkl', 'zxcvbnm', 'qweasdzxc', '1q2w3e4r', '1q2w3e4r5t', 'q1w2e3r4', 'zaq12wsx', '1qaz2wsx',
  'letmein', 'welcome', 'welcome1', 'admin', 'administrator', 'root', 'toor', 'changeme', 'default', 'secret', 'guest', 'login', 'master', 'access',
  'iloveyou', 'sunshine', 'princess', 'football', 'baseball', 'soccer', 'hockey', 'dragon', 'monkey', 'shadow', 'superman', 'batman', 'trustno1',
  'michael', 'jennifer', 'jordan', 'hunter', 'ranger', 'buster', 'thomas', 'robert', 'daniel', 'andrew', 'charlie', 'jessica', 'ashley', 'starwars',
  'freedom', 'whatever', 'computer', 'internet', 'killer', 'pepper', 'cheese', 'summer', 'winter', 'spring', 'autumn', 'flower', 'lovely', 'secure',
  'mustang', 'harley', 'maggie', 'ginger', 'cookie', 'chocolate', 'matrix', 'samsung', 'google', 'apple', 'abc123', 'a1b2c3', 'a1b2c3d4',
  'password123', '123qwe', 'qwe123', 'aa123456', 'abcd1234', '1234qwer', 'qwer1234', 'asdf1234', 'zxcv1234', 'test', 'testing', 'tester',
  'settlescope', 'settle', 'platetest', 'plateload', 'loadtest',
  '11111111', '00000000', '12341234', '11223344', '12121212', '123123123', '88888888', '1234567890', '0987654321', '147258369', '159753',
  '696969', '7777777', '112233', '121212', '123321', '654321', '666666', '987654321',
]);
