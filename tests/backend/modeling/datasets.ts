/** Small published tables used by the engine's tests. */

// Quinlan, "Induction of Decision Trees" (1986), Table 1; Mitchell (1997), Table 3.2 (rows D1–D14)
export const playTennis = [
  ['Sunny', 'Hot', 'High', 'Weak', 'No'],
  ['Sunny', 'Hot', 'High', 'Strong', 'No'],
  ['Overcast', 'Hot', 'High', 'Weak', 'Yes'],
  ['Rain', 'Mild', 'High', 'Weak', 'Yes'],
  ['Rain', 'Cool', 'Normal', 'Weak', 'Yes'],
  ['Rain', 'Cool', 'Normal', 'Strong', 'No'],
  ['Overcast', 'Cool', 'Normal', 'Strong', 'Yes'],
  ['Sunny', 'Mild', 'High', 'Weak', 'No'],
  ['Sunny', 'Cool', 'Normal', 'Weak', 'Yes'],
  ['Rain', 'Mild', 'Normal', 'Weak', 'Yes'],
  ['Sunny', 'Mild', 'Normal', 'Strong', 'Yes'],
  ['Overcast', 'Mild', 'High', 'Strong', 'Yes'],
  ['Overcast', 'Hot', 'Normal', 'Weak', 'Yes'],
  ['Rain', 'Mild', 'High', 'Strong', 'No'],
].map(([outlook, temperature, humidity, wind, play]) => ({ outlook, temperature, humidity, wind, play }));

// Tan, Steinbach & Kumar (2006), §4.3.4: annual income (thousands) and the class (from memory)
export const incomes = [
  { income: 60, cheat: 'No' },
  { income: 70, cheat: 'No' },
  { income: 75, cheat: 'No' },
  { income: 85, cheat: 'Yes' },
  { income: 90, cheat: 'Yes' },
  { income: 95, cheat: 'Yes' },
  { income: 100, cheat: 'No' },
  { income: 120, cheat: 'No' },
  { income: 125, cheat: 'No' },
  { income: 220, cheat: 'No' },
];
